-- Saved map regions (src/lib/server/repositories/saved-regions.ts): a named polygon of one user,
-- optionally shared with one of their organisations (a licence area its members may pick). Names
-- are unique per owner, ignoring case and surrounding spaces; the outline must be a valid polygon.
CREATE TABLE "saved_region" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"owner_id" text NOT NULL REFERENCES "user"("id") ON DELETE CASCADE,
	"organisation_id" text REFERENCES "organisation"("id") ON DELETE SET NULL,
	"name" text NOT NULL,
	"outline" geometry(Polygon,4326) NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "saved_region_name_length" CHECK (char_length(btrim("name")) BETWEEN 1 AND 80),
	CONSTRAINT "saved_region_outline_valid" CHECK (ST_IsValid("outline"))
);
--> statement-breakpoint
CREATE UNIQUE INDEX "saved_region_owner_name_idx" ON "saved_region" USING btree ("owner_id", lower(btrim("name")));
--> statement-breakpoint
CREATE INDEX "saved_region_organisation_idx" ON "saved_region" USING btree ("organisation_id");
