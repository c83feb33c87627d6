-- A change counter per dataset for the map's in-memory site index (src/lib/server/map-index):
-- every statement that changes a dataset's sites, or the temperature logs of its sites, gives the
-- dataset a new version from one sequence, in the same transaction. A process whose loaded copy
-- carries an older version answers that dataset from PostgreSQL until it has reloaded it.
CREATE SEQUENCE "map_site_version_seq";
--> statement-breakpoint
-- No foreign key: like map_cell_stale, a row may outlive its dataset (it is never read for a
-- dataset that is gone, the map reads versions joined to dataset).
CREATE TABLE "map_site_version" (
	"dataset_id" uuid PRIMARY KEY NOT NULL,
	"version" bigint NOT NULL
);
--> statement-breakpoint
INSERT INTO "map_site_version" ("dataset_id", "version")
SELECT "id", nextval('map_site_version_seq') FROM "dataset";
--> statement-breakpoint
-- The statement triggers of migration 0015 call this function: it now also bumps the version.
CREATE OR REPLACE FUNCTION "map_cell_mark_stale"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP IN ('INSERT', 'UPDATE') THEN
		INSERT INTO map_cell_stale (dataset_id) SELECT DISTINCT dataset_id FROM new_rows
		ON CONFLICT (dataset_id) DO UPDATE SET marked_at = now();
		INSERT INTO map_site_version (dataset_id, version)
		SELECT d.dataset_id, nextval('map_site_version_seq') FROM (SELECT DISTINCT dataset_id FROM new_rows) d
		ON CONFLICT (dataset_id) DO UPDATE SET version = EXCLUDED.version;
	END IF;
	IF TG_OP IN ('DELETE', 'UPDATE') THEN
		INSERT INTO map_cell_stale (dataset_id) SELECT DISTINCT dataset_id FROM old_rows
		ON CONFLICT (dataset_id) DO UPDATE SET marked_at = now();
		INSERT INTO map_site_version (dataset_id, version)
		SELECT d.dataset_id, nextval('map_site_version_seq') FROM (SELECT DISTINCT dataset_id FROM old_rows) d
		ON CONFLICT (dataset_id) DO UPDATE SET version = EXCLUDED.version;
	END IF;
	RETURN NULL;
END $$;
--> statement-breakpoint
-- "Has a temperature log" is a map filter: adding or removing a log changes its dataset's version.
-- Sites already gone (a cascade from a deleted site) bumped their dataset through the site trigger.
CREATE FUNCTION "map_site_version_bump_logs"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP IN ('INSERT', 'UPDATE') THEN
		INSERT INTO map_site_version (dataset_id, version)
		SELECT d.dataset_id, nextval('map_site_version_seq')
		FROM (SELECT DISTINCT s.dataset_id FROM new_rows l JOIN site s ON s.id = l.site_id) d
		ON CONFLICT (dataset_id) DO UPDATE SET version = EXCLUDED.version;
	END IF;
	IF TG_OP IN ('DELETE', 'UPDATE') THEN
		INSERT INTO map_site_version (dataset_id, version)
		SELECT d.dataset_id, nextval('map_site_version_seq')
		FROM (SELECT DISTINCT s.dataset_id FROM old_rows l JOIN site s ON s.id = l.site_id) d
		ON CONFLICT (dataset_id) DO UPDATE SET version = EXCLUDED.version;
	END IF;
	RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER "temperature_log_map_version_insert" AFTER INSERT ON "temperature_log"
	REFERENCING NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_site_version_bump_logs"();
--> statement-breakpoint
CREATE TRIGGER "temperature_log_map_version_update" AFTER UPDATE ON "temperature_log"
	REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_site_version_bump_logs"();
--> statement-breakpoint
CREATE TRIGGER "temperature_log_map_version_delete" AFTER DELETE ON "temperature_log"
	REFERENCING OLD TABLE AS old_rows
	FOR EACH STATEMENT EXECUTE FUNCTION "map_site_version_bump_logs"();
