-- The access log and its seals are append-only: the database itself refuses rewriting
-- history, whoever asks (the app's role has no UPDATE/DELETE grant either).
CREATE OR REPLACE FUNCTION seamwell_refuse_rewrite() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	RAISE EXCEPTION 'table % is append-only: % refused', TG_TABLE_NAME, TG_OP
		USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER access_log_no_update_delete
	BEFORE UPDATE OR DELETE ON access_log
	FOR EACH ROW EXECUTE FUNCTION seamwell_refuse_rewrite();
--> statement-breakpoint
CREATE TRIGGER access_log_no_truncate
	BEFORE TRUNCATE ON access_log
	FOR EACH STATEMENT EXECUTE FUNCTION seamwell_refuse_rewrite();
--> statement-breakpoint
CREATE TRIGGER access_log_seals_no_update_delete
	BEFORE UPDATE OR DELETE ON access_log_seals
	FOR EACH ROW EXECUTE FUNCTION seamwell_refuse_rewrite();
--> statement-breakpoint
CREATE TRIGGER access_log_seals_no_truncate
	BEFORE TRUNCATE ON access_log_seals
	FOR EACH STATEMENT EXECUTE FUNCTION seamwell_refuse_rewrite();
--> statement-breakpoint
-- Wake the mail worker at once when a mail is queued (LISTEN seamwell_outbox).
CREATE OR REPLACE FUNCTION seamwell_outbox_notify() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
	PERFORM pg_notify('seamwell_outbox', NEW.id::text);
	RETURN NEW;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER outbox_notify AFTER INSERT ON outbox
	FOR EACH ROW EXECUTE FUNCTION seamwell_outbox_notify();
