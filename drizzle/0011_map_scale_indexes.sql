-- Site search by the start of a code or name, case-insensitive: lower(…) LIKE 'abc%' needs text_pattern_ops.
CREATE INDEX IF NOT EXISTS "site_code_lower_prefix_idx" ON "site" USING btree (lower("code") text_pattern_ops);--> statement-breakpoint
CREATE INDEX IF NOT EXISTS "site_name_lower_prefix_idx" ON "site" USING btree (lower("name") text_pattern_ops);
