-- The audit log is append-only: no row is ever changed or removed, not even by the application.
CREATE FUNCTION audit_event_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	RAISE EXCEPTION 'audit_event is append-only (% refused)', TG_OP;
END
$$;--> statement-breakpoint
CREATE TRIGGER audit_event_no_update_or_delete BEFORE UPDATE OR DELETE ON audit_event
	FOR EACH ROW EXECUTE FUNCTION audit_event_append_only();--> statement-breakpoint
CREATE TRIGGER audit_event_no_truncate BEFORE TRUNCATE ON audit_event
	FOR EACH STATEMENT EXECUTE FUNCTION audit_event_append_only();
