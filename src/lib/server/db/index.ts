import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { config } from '../config';
import * as schema from './schema';
import { sharedTransaction } from './scope';

export type Database = NodePgDatabase<typeof schema> & { $client: pg.Pool };
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];
/** Either the database or a transaction in progress: services accept both. */
export type Executor = Database | Transaction;

let instance: Database | undefined;

/**
 * The database handle services use: the pool (created on first use, so that `vite build`
 * needs no database), or inside a page's shared transaction that transaction (`readAsOne`).
 */
export function db(): Database {
	return sharedTransaction()?.executor ?? ownDb();
}

/**
 * The pool itself, even inside a page's shared transaction: for work that must commit on its
 * own whatever happens to the page's (a refusal's access-log row).
 */
export function ownDb(): Database {
	if (!instance) instance = createDatabase(config().DATABASE_URL);
	return instance;
}

/** Ends the pool's connections (at shutdown); a later db() call opens a new pool. */
export async function closeDatabase(): Promise<void> {
	const open = instance;
	instance = undefined;
	await open?.$client.end();
}

export function createDatabase(url: string, options: pg.PoolConfig = {}): Database {
	const pool = new pg.Pool({ connectionString: url, max: 10, ...options });
	// A client whose connection drops (server restart, network) emits 'error'; without a
	// listener Node crashes the whole process. The pool listens only while a client is idle, so
	// every client gets its own listener the moment it connects, checked out or not. The query
	// in progress fails on its own (the request answers 503) and the pool drops the client.
	pool.on('connect', (client) => {
		client.on('error', (error) => logConnectionLoss(error));
	});
	pool.on('error', (error) => logConnectionLoss(error));
	return drizzle(pool, { schema }) as Database;
}

let lastLossLoggedAt = 0;

/** One line per outage, not one per connection (ten connections drop at once). */
function logConnectionLoss(error: Error): void {
	if (Date.now() - lastLossLoggedAt < 5_000) return;
	lastLossLoggedAt = Date.now();
	console.error(`[db] connection lost: ${error.message}`);
}

export { schema };
