-- The audit trail is append-only in the database itself: no role the app connects as can
-- rewrite history through UPDATE, DELETE or TRUNCATE.
CREATE FUNCTION audit_events_reject_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	RAISE EXCEPTION 'audit_events is append-only: % is not allowed', TG_OP
		USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER audit_events_append_only
	BEFORE UPDATE OR DELETE ON audit_events
	FOR EACH ROW EXECUTE FUNCTION audit_events_reject_change();
--> statement-breakpoint
CREATE TRIGGER audit_events_no_truncate
	BEFORE TRUNCATE ON audit_events
	FOR EACH STATEMENT EXECUTE FUNCTION audit_events_reject_change();
