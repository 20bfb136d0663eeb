import { sql } from 'drizzle-orm';
import { db } from './db';
import { mailHealthy } from './mail/transport';
import { storageHealthy } from './storage';

export interface Health {
	ok: boolean;
	database: boolean;
	storage: boolean;
	mail: boolean;
}

async function databaseHealthy(): Promise<boolean> {
	try {
		await db().execute(sql`select 1`);
		return true;
	} catch {
		return false;
	}
}

export async function checkHealth(): Promise<Health> {
	const [database, storage, mail] = await Promise.all([
		databaseHealthy(),
		storageHealthy(),
		mailHealthy()
	]);
	return { ok: database && storage && mail, database, storage, mail };
}
