import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { config } from '../config';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Either the database or a transaction in progress: services accept both. */
export type Executor = Database | Transaction;

let instance: Database | undefined;

/**
 * The one database handle, created on first use so that `vite build` (which imports server
 * modules) needs no database.
 */
export function db(): Database {
	if (!instance) instance = createDatabase(config().DATABASE_URL);
	return instance;
}

export function createDatabase(url: string, options: pg.PoolConfig = {}): Database {
	const pool = new pg.Pool({ connectionString: url, max: 10, ...options });
	// An idle client whose connection drops (server restart, network) emits 'error' on the
	// pool; without a listener Node would crash the process. The pool replaces the client.
	pool.on('error', (error) => {
		console.error(`[db] idle connection lost: ${error.message}`);
	});
	return drizzle(pool, { schema }) as Database;
}

export { schema };
