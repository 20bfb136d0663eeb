// Applies the committed Drizzle migrations, then grants the app's role what it needs — and on
// the access log and its seals, only INSERT and SELECT.
//
// Migrations run in a superuser session acting as the database owner (`SET ROLE`), so what
// they create belongs to the owner, while the migration that hands the log's tables to
// seamwell_log_owner (a role nobody can log in as) may step back to the session user, and
// later DDL on the log may `SET ROLE seamwell_log_owner`. No login role owns the log.
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { join } from 'node:path';
import pg from 'pg';
import { root } from './env.mjs';

/** The role that owns the access log and its seals; it cannot log in. */
export const LOG_OWNER_ROLE = 'seamwell_log_owner';
const APPEND_ONLY_TABLES = ['access_log', 'access_log_seals'];

/** @param {string} name */
const ident = (name) => {
	if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`Unsafe database identifier: ${name}`);
	return `"${name}"`;
};

/** @param {Record<string, string | undefined>} env */
export async function applyMigrations(env) {
	if (!env.DATABASE_OWNER_URL || !env.DATABASE_SUPERUSER_URL) {
		throw new Error('Migrations need DATABASE_OWNER_URL and DATABASE_SUPERUSER_URL');
	}
	const ownerUrl = new URL(env.DATABASE_OWNER_URL);
	const owner = ident(decodeURIComponent(ownerUrl.username));
	const url = new URL(env.DATABASE_SUPERUSER_URL);
	url.pathname = ownerUrl.pathname;
	// One connection throughout, so the role set here holds for every migration.
	const client = new pg.Client({ connectionString: url.toString() });
	await client.connect();
	try {
		await client.query(`SET ROLE ${owner}`);
		await migrate(drizzle(client), { migrationsFolder: join(root, 'drizzle') });
		const app = ident(env.DB_APP_USER ?? 'seamwell_app');
		const log = APPEND_ONLY_TABLES.join(', ');
		const mine = await ownedBy(client, owner);
		await client.query(`
			SET ROLE ${owner};
			GRANT USAGE ON SCHEMA public TO ${app};
			GRANT SELECT, INSERT, UPDATE, DELETE ON ${mine.tables} TO ${app};
			${mine.sequences ? `GRANT USAGE, SELECT ON SEQUENCE ${mine.sequences} TO ${app};` : ''}
			SET ROLE ${LOG_OWNER_ROLE};
			REVOKE ALL ON ${log} FROM ${app};
			GRANT SELECT, INSERT ON ${log} TO ${app};
			GRANT USAGE, SELECT ON SEQUENCE access_log_id_seq TO ${app};
			RESET ROLE;
		`);
	} finally {
		await client.end();
	}
}

/**
 * The public tables and sequences the owner holds (the log's belong to the log's own role).
 * @param {pg.Client} client
 * @param {string} owner
 */
async function ownedBy(client, owner) {
	const rows = await client.query(
		`select c.relname, c.relkind from pg_class c join pg_namespace n on n.oid = c.relnamespace
		where n.nspname = 'public' and c.relkind in ('r', 'S') and c.relowner = $1::regrole`,
		[owner]
	);
	/** @param {string} kind */
	const names = (kind) =>
		rows.rows
			.filter((/** @type {{ relkind: string }} */ r) => r.relkind === kind)
			.map((/** @type {{ relname: string }} */ r) => `"${r.relname}"`)
			.join(', ');
	return { tables: names('r'), sequences: names('S') };
}
