-- The access log and its seals belong to seamwell_log_owner, a role nobody can log in as, so
-- no login role (the owner of everything else included) can disable their triggers, replace
-- the function behind them, or rewrite a row. Migrations run in a superuser session acting as
-- the database owner (scripts/lib/migrate.mjs); this file steps back to the session user for
-- what only a superuser may do, and later DDL on the log's tables runs under
-- `SET ROLE seamwell_log_owner` (then back to the database owner, as at the end of this file).
RESET ROLE;
--> statement-breakpoint
DO $$
BEGIN
	IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = 'seamwell_log_owner') THEN
		CREATE ROLE seamwell_log_owner NOLOGIN;
	END IF;
END
$$;
--> statement-breakpoint
-- Holds even if a role of that name existed already: no log-in, no special powers.
ALTER ROLE seamwell_log_owner NOLOGIN NOSUPERUSER NOCREATEDB NOCREATEROLE NOREPLICATION NOBYPASSRLS;
--> statement-breakpoint
ALTER TABLE access_log OWNER TO seamwell_log_owner;
--> statement-breakpoint
ALTER TABLE access_log_seals OWNER TO seamwell_log_owner;
--> statement-breakpoint
ALTER FUNCTION seamwell_refuse_rewrite() OWNER TO seamwell_log_owner;
--> statement-breakpoint
SELECT set_config('role', pg_get_userbyid(datdba), false) FROM pg_database WHERE datname = current_database();
