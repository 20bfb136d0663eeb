CREATE SEQUENCE "public"."clients_limits_version_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1;--> statement-breakpoint
ALTER TABLE "clients" ADD COLUMN "limits_version" bigint DEFAULT nextval('clients_limits_version_seq') NOT NULL;--> statement-breakpoint
-- A client's limits version changes whenever anything her movement limits are computed from
-- changes, whichever code path (or person at a psql prompt) changes it: her own row, and the
-- rows of the five tables below that point at her. The limits memo keys on it. Values come
-- from one sequence, so none is ever reused.
CREATE FUNCTION "bump_client_limits_version"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF TG_OP IN ('UPDATE', 'DELETE') THEN
		IF OLD.client_id IS NOT NULL THEN
			UPDATE clients SET limits_version = nextval('clients_limits_version_seq') WHERE id = OLD.client_id;
		END IF;
	END IF;
	IF TG_OP = 'INSERT' THEN
		IF NEW.client_id IS NOT NULL THEN
			UPDATE clients SET limits_version = nextval('clients_limits_version_seq') WHERE id = NEW.client_id;
		END IF;
	ELSIF TG_OP = 'UPDATE' THEN
		IF NEW.client_id IS NOT NULL AND NEW.client_id IS DISTINCT FROM OLD.client_id THEN
			UPDATE clients SET limits_version = nextval('clients_limits_version_seq') WHERE id = NEW.client_id;
		END IF;
	END IF;
	RETURN NULL;
END $$;--> statement-breakpoint
CREATE TRIGGER "screenings_bump_limits" AFTER INSERT OR UPDATE OR DELETE ON "screenings"
	FOR EACH ROW EXECUTE FUNCTION "bump_client_limits_version"();--> statement-breakpoint
CREATE TRIGGER "clearances_bump_limits" AFTER INSERT OR UPDATE OR DELETE ON "clearances"
	FOR EACH ROW EXECUTE FUNCTION "bump_client_limits_version"();--> statement-breakpoint
CREATE TRIGGER "self_checks_bump_limits" AFTER INSERT OR UPDATE OR DELETE ON "self_checks"
	FOR EACH ROW EXECUTE FUNCTION "bump_client_limits_version"();--> statement-breakpoint
CREATE TRIGGER "home_practice_sessions_bump_limits" AFTER INSERT OR UPDATE OR DELETE ON "home_practice_sessions"
	FOR EACH ROW EXECUTE FUNCTION "bump_client_limits_version"();--> statement-breakpoint
CREATE TRIGGER "self_check_sharing_bump_limits" AFTER INSERT OR UPDATE OR DELETE ON "self_check_sharing"
	FOR EACH ROW EXECUTE FUNCTION "bump_client_limits_version"();--> statement-breakpoint
-- Any change to her own row counts too (stage, dates, delivery, postnatal check …).
CREATE FUNCTION "bump_own_limits_version"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	IF NEW.limits_version = OLD.limits_version THEN
		NEW.limits_version := nextval('clients_limits_version_seq');
	END IF;
	RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER "clients_bump_limits" BEFORE UPDATE ON "clients"
	FOR EACH ROW EXECUTE FUNCTION "bump_own_limits_version"();
