-- Per-dataset heat-flow cells of the map at zooms 0-9 (src/lib/server/repositories/map-cells.ts):
-- count, values, sum, min and max per dataset and Web Mercator cell, combined at query time over
-- the datasets the viewer may see. A change to a dataset's sites marks the dataset stale (statement
-- triggers below); stale datasets are answered from their sites until map_cell_refresh has run.
CREATE TABLE "map_cell" (
	"dataset_id" uuid NOT NULL REFERENCES "dataset"("id") ON DELETE CASCADE,
	"zoom" smallint NOT NULL,
	"ix" integer NOT NULL,
	"iy" integer NOT NULL,
	"count" integer NOT NULL,
	"with_value" integer NOT NULL,
	"sum_mw_m2" double precision,
	"min_mw_m2" double precision,
	"max_mw_m2" double precision,
	CONSTRAINT "map_cell_pkey" PRIMARY KEY ("zoom", "ix", "iy", "dataset_id")
);
--> statement-breakpoint
-- No foreign key: a marker may outlive its dataset (deleted with its sites) until the next refresh.
CREATE TABLE "map_cell_stale" (
	"dataset_id" uuid PRIMARY KEY NOT NULL,
	"marked_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
INSERT INTO "map_cell_stale" ("dataset_id") SELECT DISTINCT "dataset_id" FROM "site";
--> statement-breakpoint
-- DO UPDATE (not DO NOTHING) locks the marker, so a refresh that deletes it waits for the change
-- to commit and then reads its sites: no change can slip between a refresh and its marker.
CREATE FUNCTION "map_cell_mark_stale"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP IN ('INSERT', 'UPDATE') THEN
		INSERT INTO map_cell_stale (dataset_id) SELECT DISTINCT dataset_id FROM new_rows
		ON CONFLICT (dataset_id) DO UPDATE SET marked_at = now();
	END IF;
	IF TG_OP IN ('DELETE', 'UPDATE') THEN
		INSERT INTO map_cell_stale (dataset_id) SELECT DISTINCT dataset_id FROM old_rows
		ON CONFLICT (dataset_id) DO UPDATE SET marked_at = now();
	END IF;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER "site_map_cell_insert" AFTER INSERT ON "site" REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_cell_mark_stale"();
--> statement-breakpoint
CREATE TRIGGER "site_map_cell_update" AFTER UPDATE ON "site"
	REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_cell_mark_stale"();
--> statement-breakpoint
CREATE TRIGGER "site_map_cell_delete" AFTER DELETE ON "site" REFERENCING OLD TABLE AS old_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_cell_mark_stale"();
--> statement-breakpoint
-- Rebuild one dataset's cells. VOLATILE: each statement reads a fresh snapshot, so the sites read
-- after the marker is deleted include every change committed before. Zoom 9 from the sites (the
-- cell formulas of repositories/map.ts: 48-px cells of 256-px Web Mercator tiles), coarser zooms
-- from zoom 9 (a cell at zoom z is exactly 2^(9-z) zoom-9 cells wide, so >> is floor division).
CREATE FUNCTION "map_cell_refresh"(d uuid) RETURNS void LANGUAGE sql VOLATILE AS $$
	-- One rebuild at a time (until the caller's transaction ends): two at once would collide.
	SELECT pg_advisory_xact_lock(hashtext('map_cell_refresh'));
	DELETE FROM map_cell_stale WHERE dataset_id = d;
	DELETE FROM map_cell WHERE dataset_id = d;
	INSERT INTO map_cell (dataset_id, zoom, ix, iy, count, with_value, sum_mw_m2, min_mw_m2, max_mw_m2)
	SELECT d, 9, c.ix, c.iy, count(*), count(c.hf), sum(c.hf), min(c.hf), max(c.hf)
	FROM (
		SELECT floor(ST_X(location) * (pi() * 6378137 / 180) / (2 * pi() * 6378137 / 512 / 256 * 48))::int AS ix,
			floor(6378137 * ln(tan(pi() / 4 + radians(greatest(-85.0511287798, least(85.0511287798, ST_Y(location)))) / 2))
				/ (2 * pi() * 6378137 / 512 / 256 * 48))::int AS iy,
			heat_flow_mw_m2 AS hf
		FROM site WHERE dataset_id = d
	) c
	GROUP BY c.ix, c.iy;
	INSERT INTO map_cell (dataset_id, zoom, ix, iy, count, with_value, sum_mw_m2, min_mw_m2, max_mw_m2)
	SELECT d, z, ix >> (9 - z), iy >> (9 - z), sum(count), sum(with_value), sum(sum_mw_m2), min(min_mw_m2), max(max_mw_m2)
	FROM map_cell, generate_series(0, 8) AS z
	WHERE dataset_id = d AND zoom = 9
	GROUP BY z, ix >> (9 - z), iy >> (9 - z);
$$;
