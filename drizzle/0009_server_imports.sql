-- Imports owned by the server: the uploaded file (an attachment), its parsed table, settings,
-- the contributor's corrections and exclusions and the preview are kept with the batch; a commit
-- is a job on the queue. Sites keep the warnings they were imported with as flags.
ALTER TYPE "import_status" ADD VALUE IF NOT EXISTS 'draft' BEFORE 'running';--> statement-breakpoint
ALTER TYPE "import_status" ADD VALUE IF NOT EXISTS 'queued' BEFORE 'running';--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "attachment_id" uuid;--> statement-breakpoint
ALTER TABLE "import_batch" ADD CONSTRAINT "import_batch_attachment_id_attachment_id_fk" FOREIGN KEY ("attachment_id") REFERENCES "public"."attachment"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "parsed_table" json;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "settings" jsonb;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "edits" jsonb DEFAULT '{"corrections":[],"excluded":[]}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "preview" json;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "sites" json;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "revision" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "attempts" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "import_batch" ADD COLUMN "heartbeat_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "site" ADD COLUMN "flags" text[] DEFAULT '{}' NOT NULL;--> statement-breakpoint
ALTER TABLE "site" ADD COLUMN "import_batch_id" uuid;--> statement-breakpoint
ALTER TABLE "site" ADD CONSTRAINT "site_import_batch_id_import_batch_id_fk" FOREIGN KEY ("import_batch_id") REFERENCES "public"."import_batch"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_flags_gin" ON "site" USING gin ("flags");
