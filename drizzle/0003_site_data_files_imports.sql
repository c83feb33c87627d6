CREATE TYPE "public"."log_heat_flow_method" AS ENUM('interval', 'bullard');--> statement-breakpoint
CREATE TYPE "public"."attachment_status" AS ENUM('pending', 'ready');--> statement-breakpoint
CREATE TYPE "public"."import_status" AS ENUM('running', 'done', 'failed');--> statement-breakpoint
CREATE TABLE "conductivity_sample" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"top_m" double precision NOT NULL,
	"bottom_m" double precision NOT NULL,
	"conductivity_w_mk" double precision NOT NULL,
	"sigma_w_mk" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "heat_flow_computation" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"log_id" uuid,
	"method" "log_heat_flow_method" NOT NULL,
	"from_m" double precision NOT NULL,
	"to_m" double precision NOT NULL,
	"heat_flow_mw_m2" double precision NOT NULL,
	"sigma_mw_m2" double precision NOT NULL,
	"gradient_k_per_km" double precision NOT NULL,
	"sigma_gradient_k_per_km" double precision NOT NULL,
	"mean_conductivity_w_mk" double precision NOT NULL,
	"samples" integer NOT NULL,
	"engine_version" text NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "temperature_log" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"name" text NOT NULL,
	"source_file_name" text,
	"depth_m" double precision[] NOT NULL,
	"temperature_c" double precision[] NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "attachment" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"dataset_id" uuid NOT NULL,
	"site_id" uuid,
	"object_key" text NOT NULL,
	"thumbnail_key" text,
	"file_name" text NOT NULL,
	"content_type" text,
	"size_bytes" bigint,
	"sha256" text,
	"status" "attachment_status" DEFAULT 'pending' NOT NULL,
	"uploaded_by" text,
	"uploaded_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "attachment_objectKey_unique" UNIQUE("object_key")
);
--> statement-breakpoint
CREATE TABLE "import_batch" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"dataset_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"file_sha256" text NOT NULL,
	"total_rows" bigint NOT NULL,
	"done_rows" bigint DEFAULT 0 NOT NULL,
	"status" "import_status" DEFAULT 'running' NOT NULL,
	"error" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "conductivity_sample" ADD CONSTRAINT "conductivity_sample_site_id_site_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."site"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "heat_flow_computation" ADD CONSTRAINT "heat_flow_computation_site_id_site_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."site"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "heat_flow_computation" ADD CONSTRAINT "heat_flow_computation_log_id_temperature_log_id_fk" FOREIGN KEY ("log_id") REFERENCES "public"."temperature_log"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "heat_flow_computation" ADD CONSTRAINT "heat_flow_computation_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "temperature_log" ADD CONSTRAINT "temperature_log_site_id_site_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."site"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "temperature_log" ADD CONSTRAINT "temperature_log_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachment" ADD CONSTRAINT "attachment_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachment" ADD CONSTRAINT "attachment_site_id_site_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."site"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "attachment" ADD CONSTRAINT "attachment_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_batch" ADD CONSTRAINT "import_batch_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_batch" ADD CONSTRAINT "import_batch_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "conductivity_sample_site_idx" ON "conductivity_sample" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "heat_flow_computation_site_idx" ON "heat_flow_computation" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "temperature_log_site_idx" ON "temperature_log" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "attachment_dataset_idx" ON "attachment" USING btree ("dataset_id");--> statement-breakpoint
CREATE INDEX "attachment_site_idx" ON "attachment" USING btree ("site_id");--> statement-breakpoint
CREATE INDEX "import_batch_dataset_idx" ON "import_batch" USING btree ("dataset_id","file_sha256");