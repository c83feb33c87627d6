-- Interpolated heat-flow grids computed by the `grid` job queue (src/lib/server/grids/).
CREATE TYPE "public"."grid_status" AS ENUM('queued', 'running', 'done', 'failed');--> statement-breakpoint
CREATE TABLE "grid" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"input_hash" text NOT NULL,
	"status" "grid_status" DEFAULT 'queued' NOT NULL,
	"progress" double precision DEFAULT 0 NOT NULL,
	"attempt" integer DEFAULT 0 NOT NULL,
	"error" text,
	"request" jsonb NOT NULL,
	"plan" jsonb NOT NULL,
	"samples" jsonb NOT NULL,
	"dataset_ids" uuid[] NOT NULL,
	"result" jsonb,
	"value_f32" bytea,
	"sigma_f32" bytea,
	"requested_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);--> statement-breakpoint
CREATE UNIQUE INDEX "grid_input_hash_live_idx" ON "grid" USING btree ("input_hash") WHERE "grid"."status" <> 'failed';--> statement-breakpoint
CREATE INDEX "grid_created_idx" ON "grid" USING btree ("created_at");
