-- Site values with history: every change of a site's heat-flow values is a revision beside the
-- values as submitted; the site's own columns keep the chosen (current) values, so the map, the
-- filters and the APIs read them unchanged. The table of site computations (heat flow from a log)
-- also holds the bottom-hole-temperature, palaeoclimate and heat-production computations.
CREATE TYPE "public"."site_value_source" AS ENUM('submitted', 'log_computation', 'correction');--> statement-breakpoint
CREATE TYPE "public"."site_computation_kind" AS ENUM('heat_flow', 'horner_bht', 'palaeoclimate', 'heat_production');--> statement-breakpoint
ALTER TABLE "heat_flow_computation" RENAME TO "site_computation";--> statement-breakpoint
ALTER TABLE "site_computation" RENAME CONSTRAINT "heat_flow_computation_pkey" TO "site_computation_pkey";--> statement-breakpoint
ALTER TABLE "site_computation" RENAME CONSTRAINT "heat_flow_computation_site_id_site_id_fk" TO "site_computation_site_id_site_id_fk";--> statement-breakpoint
ALTER TABLE "site_computation" RENAME CONSTRAINT "heat_flow_computation_log_id_temperature_log_id_fk" TO "site_computation_log_id_temperature_log_id_fk";--> statement-breakpoint
ALTER TABLE "site_computation" RENAME CONSTRAINT "heat_flow_computation_created_by_user_id_fk" TO "site_computation_created_by_user_id_fk";--> statement-breakpoint
ALTER INDEX "heat_flow_computation_site_idx" RENAME TO "site_computation_site_idx";--> statement-breakpoint
ALTER TABLE "site_computation" ADD COLUMN "kind" "site_computation_kind" DEFAULT 'heat_flow' NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ADD COLUMN "inputs" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ADD COLUMN "result" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "method" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "from_m" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "to_m" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "heat_flow_mw_m2" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "sigma_mw_m2" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "gradient_k_per_km" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "sigma_gradient_k_per_km" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "mean_conductivity_w_mk" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ALTER COLUMN "samples" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "site_computation" ADD CONSTRAINT "site_computation_heat_flow_columns" CHECK ("kind" <> 'heat_flow' OR ("method" IS NOT NULL AND "from_m" IS NOT NULL AND "to_m" IS NOT NULL AND "heat_flow_mw_m2" IS NOT NULL AND "sigma_mw_m2" IS NOT NULL AND "gradient_k_per_km" IS NOT NULL AND "sigma_gradient_k_per_km" IS NOT NULL AND "mean_conductivity_w_mk" IS NOT NULL AND "samples" IS NOT NULL));--> statement-breakpoint
CREATE TABLE "site_value_revision" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"source" "site_value_source" NOT NULL,
	"heat_flow_mw_m2" double precision,
	"heat_flow_sigma_mw_m2" double precision,
	"gradient_k_per_km" double precision,
	"gradient_sigma_k_per_km" double precision,
	"conductivity_w_mk" double precision,
	"conductivity_sigma_w_mk" double precision,
	"conductivity_samples" integer,
	"top_depth_m" double precision,
	"bottom_depth_m" double precision,
	"method" "heat_flow_method" NOT NULL,
	"import_batch_id" uuid,
	"computation_id" uuid,
	"reason" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "site_value_revision_reason" CHECK ("source" <> 'correction' OR length(btrim(coalesce("reason", ''))) > 0)
);
--> statement-breakpoint
ALTER TABLE "site_value_revision" ADD CONSTRAINT "site_value_revision_site_id_site_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."site"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_value_revision" ADD CONSTRAINT "site_value_revision_import_batch_id_import_batch_id_fk" FOREIGN KEY ("import_batch_id") REFERENCES "public"."import_batch"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_value_revision" ADD CONSTRAINT "site_value_revision_computation_id_site_computation_id_fk" FOREIGN KEY ("computation_id") REFERENCES "public"."site_computation"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_value_revision" ADD CONSTRAINT "site_value_revision_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "site_value_revision_site_idx" ON "site_value_revision" USING btree ("site_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "site_value_revision_one_submitted_idx" ON "site_value_revision" USING btree ("site_id") WHERE "site_value_revision"."source" = 'submitted';--> statement-breakpoint
ALTER TABLE "site" ADD COLUMN "current_revision_id" uuid;--> statement-breakpoint
ALTER TABLE "site" ADD CONSTRAINT "site_current_revision_id_site_value_revision_id_fk" FOREIGN KEY ("current_revision_id") REFERENCES "public"."site_value_revision"("id") ON DELETE set null ON UPDATE no action;
