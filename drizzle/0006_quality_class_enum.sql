-- site.quality_class becomes the quality_class enum (the list in src/lib/sites/quality.ts).
-- Until now the column was text written only by qualityClass(), so every stored value is one of
-- the four classes. Anything else (hand-edited rows) stops the migration with the values listed:
-- the migrator runs pending migrations in one transaction, so nothing is half-converted.
DO $$
DECLARE
	unknown text;
BEGIN
	SELECT string_agg(DISTINCT quote_literal(quality_class), ', ') INTO unknown FROM site
	WHERE quality_class IS NOT NULL
		AND quality_class NOT IN ('well-constrained', 'constrained', 'indicative', 'unconstrained');
	IF unknown IS NOT NULL THEN
		RAISE EXCEPTION 'site.quality_class holds values that are not quality classes: %. Set them to one of well-constrained, constrained, indicative, unconstrained (or NULL) and migrate again.', unknown;
	END IF;
END $$;--> statement-breakpoint
CREATE TYPE "public"."quality_class" AS ENUM('well-constrained', 'constrained', 'indicative', 'unconstrained');--> statement-breakpoint
ALTER TABLE "site" ALTER COLUMN "quality_class" SET DATA TYPE "public"."quality_class" USING "quality_class"::"public"."quality_class";
