// Brings up the database (installed, initialised, started, migrated) for a given env.
import { join } from 'node:path';
import { applyMigrations } from './migrate.mjs';
import { ensureDatabase, ensurePostgresInstalled, startPostgres } from './postgres.mjs';

export async function bringUpDatabase(env, { dataDir, throwaway = false, log = console.log }) {
	const bin = ensurePostgresInstalled(log);
	const server = startPostgres({
		bin,
		dataDir,
		port: env.PGPORT,
		superPassword: env.DB_SUPERUSER_PASSWORD,
		throwaway,
		log
	});
	try {
		await ensureDatabase(env);
		await applyMigrations(env);
	} catch (error) {
		// A migration that fails must not leave a server running on the port for the next run.
		await server.stop();
		throw error;
	}
	log(`PostgreSQL 127.0.0.1:${env.PGPORT} (data in ${dataDir})`);
	return server;
}

export const defaultDataDir = (root, env) => env.PGDATA_DIR ?? join(root, '.data', 'pg');
