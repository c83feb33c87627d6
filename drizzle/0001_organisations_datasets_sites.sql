CREATE TYPE "public"."dataset_status" AS ENUM('draft', 'in_review', 'returned', 'published', 'retired');--> statement-breakpoint
CREATE TYPE "public"."dataset_visibility" AS ENUM('public', 'embargoed', 'restricted', 'private');--> statement-breakpoint
CREATE TYPE "public"."heat_flow_method" AS ENUM('borehole_interval', 'bullard', 'bottom_hole_temperature', 'marine_probe', 'other');--> statement-breakpoint
CREATE TABLE "organisation" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"slug" text NOT NULL,
	"logo" text,
	"metadata" text,
	"country" text,
	"website" text,
	"description" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisation_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "dataset" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" text NOT NULL,
	"title" text NOT NULL,
	"abstract" text DEFAULT '' NOT NULL,
	"keywords" text[] DEFAULT '{}' NOT NULL,
	"licence" text NOT NULL,
	"citation" text DEFAULT '' NOT NULL,
	"doi" text,
	"version" integer DEFAULT 1 NOT NULL,
	"status" "dataset_status" DEFAULT 'draft' NOT NULL,
	"visibility" "dataset_visibility" DEFAULT 'private' NOT NULL,
	"embargo_until" date,
	"created_by" text,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "site" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"dataset_id" uuid NOT NULL,
	"code" text NOT NULL,
	"name" text,
	"location" geometry(Point,4326) NOT NULL,
	"original_x" double precision,
	"original_y" double precision,
	"original_epsg" integer,
	"elevation_m" double precision,
	"water_depth_m" double precision,
	"top_depth_m" double precision,
	"bottom_depth_m" double precision,
	"heat_flow_mw_m2" double precision,
	"heat_flow_sigma_mw_m2" double precision,
	"gradient_k_per_km" double precision,
	"gradient_sigma_k_per_km" double precision,
	"conductivity_w_mk" double precision,
	"conductivity_sigma_w_mk" double precision,
	"conductivity_samples" integer,
	"conductivity_method" text,
	"heat_production_uw_m3" double precision,
	"heat_production_sigma_uw_m3" double precision,
	"surface_temperature_c" double precision,
	"method" "heat_flow_method" DEFAULT 'other' NOT NULL,
	"corrections" text[] DEFAULT '{}' NOT NULL,
	"year_measured" smallint,
	"remarks" text,
	"quality_class" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "dataset" ADD CONSTRAINT "dataset_organisation_id_organisation_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisation"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site" ADD CONSTRAINT "site_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "dataset_organisation_idx" ON "dataset" USING btree ("organisation_id");--> statement-breakpoint
CREATE UNIQUE INDEX "site_dataset_code_idx" ON "site" USING btree ("dataset_id","code");--> statement-breakpoint
CREATE INDEX "site_location_gist" ON "site" USING gist ("location");--> statement-breakpoint
CREATE INDEX "site_location_geog_gist" ON "site" USING gist (("location"::geography));