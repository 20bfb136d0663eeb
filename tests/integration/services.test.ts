import { randomBytes, randomUUID } from 'node:crypto';
import { afterAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { applyMigrations } from '../../scripts/lib/migrate.mjs';
import { createDatabase, db } from '../../src/lib/server/db';
import { deliver } from '../../src/lib/server/mail/transport';
import {
	deleteObject,
	getObject,
	objectExists,
	putObject,
	storageHealthy,
	useS3Endpoint
} from '../../src/lib/server/storage';
import { inbox, requireEnv, superuser, uniqueAddress, waitForMail } from '../support/services';

describe('PostgreSQL', () => {
	const scratch = `seamwell_roundtrip_${randomBytes(4).toString('hex')}`;

	afterAll(async () => {
		const admin = await superuser();
		await admin.query(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`);
		await admin.end();
	});

	it('applies every committed migration to an empty database, twice without harm', async () => {
		const admin = await superuser();
		await admin.query(`CREATE DATABASE ${scratch} OWNER ${requireEnv('DB_OWNER_USER')}`);
		await admin.end();
		const ownerUrl = new URL(requireEnv('DATABASE_OWNER_URL'));
		ownerUrl.pathname = `/${scratch}`;
		const env = { ...process.env, DATABASE_OWNER_URL: ownerUrl.toString() };

		await applyMigrations(env);
		await applyMigrations(env); // already applied: nothing to do, no error

		const check = await superuser(scratch);
		const tables = await check.query<{ tablename: string }>(
			`select tablename from pg_tables where schemaname = 'public' order by tablename`
		);
		expect(tables.rows.map((r) => r.tablename)).toEqual(
			expect.arrayContaining(['users', 'sessions', 'organisations', 'access_log', 'outbox'])
		);
		const applied = await check.query(
			'select count(*)::int as n from drizzle.__drizzle_migrations'
		);
		const { readdirSync } = await import('node:fs');
		const files = readdirSync('drizzle').filter((f) => f.endsWith('.sql'));
		expect(applied.rows[0].n).toBe(files.length);
		await check.end();
	});

	it('the app survives its connections being cut by the server', async () => {
		const database = createDatabase(requireEnv('DATABASE_URL'), { max: 2 });
		await database.execute(sql`select 1`);
		const admin = await superuser();
		await admin.query(
			`select pg_terminate_backend(pid) from pg_stat_activity
			 where usename = $1 and pid <> pg_backend_pid() and application_name = ''`,
			[requireEnv('DB_APP_USER')]
		);
		await admin.end();
		await new Promise((r) => setTimeout(r, 100));
		// The pool drops the dead client (logged, not thrown) and opens a new one.
		const result = await database.execute<{ one: number }>(sql`select 1 as one`);
		expect(result.rows[0]?.one).toBe(1);
		await database.$client.end();
	});

	it('the shared handle reaches the database as the app role', async () => {
		const result = await db().execute<{ who: string }>(sql`select current_user as who`);
		expect(result.rows[0]?.who).toBe(requireEnv('DB_APP_USER'));
	});
});

describe('S3 fake through the AWS SDK', () => {
	it('puts, gets and deletes an object', async () => {
		const key = `test/${randomUUID()}.bin`;
		const body = randomBytes(4096);
		await putObject(key, body, 'application/octet-stream');
		expect(await objectExists(key)).toBe(true);
		const back = await getObject(key);
		expect(Buffer.compare(back, body)).toBe(0);
		await deleteObject(key);
		expect(await objectExists(key)).toBe(false);
	});
});

describe('mail fake over SMTP', () => {
	it('a message sent with nodemailer is read back from the inbox API', async () => {
		const to = uniqueAddress('mailcheck');
		await deliver({ to, subject: 'Seamwell test message', text: 'Hello from the test.' });
		const [message] = await waitForMail(to);
		expect(message?.to).toEqual([to]);
		expect(message?.subject).toBe('Seamwell test message');
		expect(message?.text.trim()).toBe('Hello from the test.');
	});
});

describe('health check', () => {
	it('tells when the S3 store does not answer, and when it is back', async () => {
		expect(await storageHealthy()).toBe(true);
		useS3Endpoint('http://127.0.0.1:9'); // nothing listens on the discard port
		try {
			expect(await storageHealthy()).toBe(false);
		} finally {
			useS3Endpoint(null);
		}
		expect(await storageHealthy()).toBe(true);
	});
});

describe('mail fake inbox API', () => {
	it('lists messages newest first with their fields, filters by address, and empties', async () => {
		const to = uniqueAddress('inbox');
		await deliver({ to, subject: 'first', text: 'one' });
		await deliver({ to, subject: 'second', text: 'two', html: '<p>two</p>' });
		const messages = await waitForMail(to, 2);
		expect(messages.map((m) => m.subject)).toEqual(['second', 'first']);
		expect(Object.keys(messages[0]!)).toEqual(
			expect.arrayContaining(['id', 'to', 'subject', 'text', 'html', 'date'])
		);
		expect(messages[0]!.html).toContain('<p>two</p>');
		expect(messages[1]!.html).toBeNull();
		expect(Date.parse(messages[0]!.date)).toBeGreaterThanOrEqual(Date.parse(messages[1]!.date));

		const base = requireEnv('MAIL_INBOX_URL');
		const removed = await fetch(`${base}/api/messages?to=${encodeURIComponent(to)}`, {
			method: 'DELETE'
		});
		expect(removed.status).toBe(204);
		expect(await inbox(to)).toEqual([]);
	});
});
