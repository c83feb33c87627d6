CREATE TABLE "audit_event" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL,
	"actor_id" text,
	"actor_name" text,
	"actor_email" text,
	"action" text NOT NULL,
	"organisation_id" text,
	"dataset_id" uuid,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL
);
--> statement-breakpoint
CREATE INDEX "audit_event_dataset_idx" ON "audit_event" USING btree ("dataset_id","at");--> statement-breakpoint
CREATE INDEX "audit_event_organisation_idx" ON "audit_event" USING btree ("organisation_id","at");