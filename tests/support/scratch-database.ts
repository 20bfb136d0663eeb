// For integration tests that tamper with the access log or run workers of their own: a fresh,
// migrated database per test, so the shared test database stays intact for everything else.
import { randomBytes } from 'node:crypto';
import pg from 'pg';
import { applyMigrations } from '../../scripts/lib/migrate.mjs';
import { superuser, requireEnv } from './services';
import { createDatabase, type Database } from '../../src/lib/server/db';

export interface ScratchDatabase {
	name: string;
	/** URL for the app's role (INSERT and SELECT only on the log). */
	appUrl: string;
	/** A pool as the app's role. */
	app: Database;
	/** Runs SQL as superuser in this database (for tampering). */
	asSuperuser<T>(work: (client: pg.Client) => Promise<T>): Promise<T>;
	drop(): Promise<void>;
}

function withDatabase(url: string, name: string) {
	const u = new URL(url);
	u.pathname = `/${name}`;
	return u.toString();
}

export async function createScratchDatabase(label: string): Promise<ScratchDatabase> {
	const name = `seamwell_${label}_${randomBytes(4).toString('hex')}`;
	const admin = await superuser();
	await admin.query(`CREATE DATABASE ${name} OWNER ${requireEnv('DB_OWNER_USER')}`);
	await admin.end();
	await applyMigrations({
		...process.env,
		DATABASE_OWNER_URL: withDatabase(requireEnv('DATABASE_OWNER_URL'), name)
	});
	const appUrl = withDatabase(requireEnv('DATABASE_URL'), name);
	const app = createDatabase(appUrl, { max: 5 });
	const pools: Database[] = [app];
	return {
		name,
		appUrl,
		app,
		async asSuperuser(work) {
			const client = await superuser(name);
			try {
				return await work(client);
			} finally {
				await client.end();
			}
		},
		async drop() {
			await Promise.all(pools.map((p) => p.$client.end()));
			const dropper = await superuser();
			await dropper.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
			await dropper.end();
		}
	};
}
