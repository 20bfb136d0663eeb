// Applies the committed Drizzle migrations as the owner role, then grants the app's role
// what it needs — and on the access log and its seals, only INSERT and SELECT.
import { drizzle } from 'drizzle-orm/node-postgres';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { join } from 'node:path';
import pg from 'pg';
import { root } from './env.mjs';

const APPEND_ONLY_TABLES = ['access_log', 'access_log_seals'];

/** @param {Record<string, string | undefined>} env */
export async function applyMigrations(env) {
	const pool = new pg.Pool({ connectionString: env.DATABASE_OWNER_URL, max: 1 });
	try {
		await migrate(drizzle(pool), { migrationsFolder: join(root, 'drizzle') });
		const app = `"${env.DB_APP_USER}"`;
		await pool.query(`
			GRANT USAGE ON SCHEMA public TO ${app};
			GRANT SELECT, INSERT, UPDATE, DELETE ON ALL TABLES IN SCHEMA public TO ${app};
			GRANT USAGE, SELECT ON ALL SEQUENCES IN SCHEMA public TO ${app};
			REVOKE UPDATE, DELETE, TRUNCATE ON ${APPEND_ONLY_TABLES.join(', ')} FROM ${app};
		`);
	} finally {
		await pool.end();
	}
}
