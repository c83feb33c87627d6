-- Versions: a published dataset is corrected through a new draft version that names the one it
-- corrects; publishing it records the link back (superseded_by). One successor per version.
ALTER TABLE "dataset" ADD COLUMN "previous_version_id" uuid;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "superseded_by_id" uuid;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "published_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "authors" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_previous_version_id_dataset_id_fk" FOREIGN KEY ("previous_version_id") REFERENCES "public"."dataset"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_superseded_by_id_dataset_id_fk" FOREIGN KEY ("superseded_by_id") REFERENCES "public"."dataset"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "dataset_previous_version_idx" ON "dataset" USING btree ("previous_version_id");--> statement-breakpoint
-- Datasets published before this column existed: their last change is the best date known.
UPDATE "dataset" SET "published_at" = "updated_at" WHERE "status" IN ('published', 'retired');--> statement-breakpoint
-- The audit page lists all events newest first for administrators.
CREATE INDEX "audit_event_at_idx" ON "audit_event" USING btree ("at");
