import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { desc, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { requireEnv } from '../../../../tests/support/services';
import { db } from '../db';
import { accessLog, subjectKeys } from '../db/schema';
import { recordAccess, recordAccesses, recordRefusal, type AccessContext } from './writer';
import type { AuditAction } from './actions';
import { sealPending } from './sealer';
import { createTestClient } from '../../../../tests/support/audit-client';
import {
	createScratchDatabase,
	type ScratchDatabase
} from '../../../../tests/support/scratch-database';
import { verifyChain } from './verify';

// The writer against the real database (shared test database, app role), and the
// database's own refusal to rewrite history.

const context = (): AccessContext => ({
	userId: randomUUID(),
	role: 'instructor',
	organisationId: randomUUID(),
	address: '203.0.113.7',
	userAgent: 'Mozilla/5.0 (integration test)'
});

async function rowsOf(userId: string) {
	return db()
		.select()
		.from(accessLog)
		.where(eq(accessLog.actorUserId, userId))
		.orderBy(desc(accessLog.id));
}

async function connect(url: string) {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	return client;
}

describe('the access-log writer', () => {
	it('a key made in a transaction that rolls back is not reused: every logged key maps to its client', async () => {
		const who = context();
		const client = await createTestClient(db());
		const rollback = new Error('roll back');
		await expect(
			db().transaction(async (tx) => {
				// The first access makes her key; the second finds it, still uncommitted.
				await recordAccess(tx, who, {
					action: 'client.read',
					outcome: 'success',
					clientId: client
				});
				await recordAccess(tx, who, {
					action: 'client.read',
					outcome: 'success',
					clientId: client
				});
				throw rollback;
			})
		).rejects.toBe(rollback);
		for (let i = 0; i < 2; i++) {
			await db().transaction((tx) =>
				recordAccess(tx, who, { action: 'client.read', outcome: 'success', clientId: client })
			);
		}
		const [row] = await db()
			.select({ key: subjectKeys.key })
			.from(subjectKeys)
			.where(eq(subjectKeys.clientId, client));
		const logged = await rowsOf(who.userId!);
		expect(logged).toHaveLength(2);
		expect(logged.map((r) => r.subjectKey)).toEqual([row!.key, row!.key]);
	});

	it('records a batch in order with one key per client, creating only the missing keys', async () => {
		const who = context();
		const known = await createTestClient(db());
		const fresh = await createTestClient(db());
		await db().transaction((tx) =>
			recordAccess(tx, who, { action: 'client.read', outcome: 'success', clientId: known })
		);
		const [{ key: knownKey }] = (await db()
			.select({ key: subjectKeys.key })
			.from(subjectKeys)
			.where(eq(subjectKeys.clientId, known))) as [{ key: string }];
		await db().transaction((tx) =>
			recordAccesses(tx, who, [
				{
					action: 'client.listed',
					outcome: 'success',
					target: { type: 'client', id: known },
					clientId: known
				},
				{
					action: 'client.listed',
					outcome: 'success',
					target: { type: 'client', id: fresh },
					clientId: fresh
				},
				{
					action: 'client.listed',
					outcome: 'success',
					target: { type: 'client', id: known },
					clientId: known
				}
			])
		);
		const rows = (await rowsOf(who.userId!)).reverse().slice(1);
		expect(rows.map((r) => r.targetId)).toEqual([known, fresh, known]);
		expect(rows[0]!.subjectKey).toBe(knownKey);
		expect(rows[2]!.subjectKey).toBe(knownKey);
		expect(rows[1]!.subjectKey).toBeTruthy();
		expect(rows[1]!.subjectKey).not.toBe(knownKey);
		expect(new Set(rows.map((r) => r.id)).size).toBe(3);
	});

	it('records each field, with a subject key in place of the client id', async () => {
		const who = context();
		const clientId = await createTestClient(db());
		const targetId = clientId;
		const before = Date.now();
		await db().transaction((tx) =>
			recordAccess(tx, who, {
				action: 'client.read',
				outcome: 'success',
				target: { type: 'client', id: targetId },
				clientId
			})
		);
		const [row] = await rowsOf(who.userId!);
		expect(row).toMatchObject({
			actorUserId: who.userId,
			actorRole: 'instructor',
			actorOrganisationId: who.organisationId,
			action: 'client.read',
			targetType: 'client',
			targetId,
			outcome: 'success',
			clientAddress: '203.0.113.7',
			userAgent: 'Mozilla/5.0 (integration test)'
		});
		// The database's clock stamps the row (UTC instant); allow for clock skew and latency.
		expect(Math.abs(row!.at.getTime() - before)).toBeLessThan(5_000);
		expect(row!.subjectKey).toBeTruthy();
		expect(row!.subjectKey).not.toBe(clientId);
		const [map] = await db()
			.select()
			.from(subjectKeys)
			.where(eq(subjectKeys.key, row!.subjectKey!));
		expect(map?.clientId).toBe(clientId);

		// The same client keeps her key.
		await recordAccess(db(), who, { action: 'screening.read', outcome: 'success', clientId });
		const rows = await rowsOf(who.userId!);
		expect(rows).toHaveLength(2);
		expect(rows[0]!.subjectKey).toBe(rows[1]!.subjectKey);
	});

	it('refuses an action code that is not on the published list', async () => {
		const who = context();
		await expect(
			recordAccess(db(), who, {
				action: 'client.measurements' as AuditAction,
				outcome: 'success'
			})
		).rejects.toThrow(/unknown access-log action/);
		expect(await rowsOf(who.userId!)).toHaveLength(0);
	});

	it('keeps a refusal recorded inside a transaction that rolls back', async () => {
		const who = context();
		const target = { type: 'document', id: randomUUID() };
		await expect(
			db().transaction(async (tx) => {
				await recordAccess(tx, who, { action: 'document.downloaded', outcome: 'success', target });
				await recordRefusal(who, { action: 'access.denied', target });
				throw new Error('the work fails after the refusal');
			})
		).rejects.toThrow('the work fails');
		const rows = await rowsOf(who.userId!);
		expect(rows.map((r) => [r.action, r.outcome])).toEqual([['access.denied', 'refused']]);
	});
});

describe('the database refuses rewriting the log', () => {
	// A database of its own: the seal table gets a real seal, which must not touch the shared one.
	let scratch: ScratchDatabase;
	let rowId: number;
	beforeAll(async () => {
		scratch = await createScratchDatabase('rewrite');
		await recordAccess(scratch.app, context(), { action: 'client.listed', outcome: 'success' });
		const sealed = await sealPending(scratch.app, { gapGraceMs: 0 });
		rowId = sealed.headRowId!;
	});
	afterAll(() => scratch?.drop());

	const statements = [
		`update access_log set action = 'client.updated' where id = $1`,
		`delete from access_log where id = $1`,
		`truncate access_log`,
		`update access_log_seals set hash = repeat('0', 64) where row_id = $1`,
		`delete from access_log_seals where row_id = $1`,
		`truncate access_log_seals`
	];

	it.each([
		// The app role has no UPDATE, DELETE or TRUNCATE grant: refused before the triggers.
		['the app role', 'DATABASE_URL', /permission denied/],
		// The owner of everything else no longer owns the log (seamwell_log_owner does): no grant.
		['the owner', 'DATABASE_OWNER_URL', /permission denied/]
	])('UPDATE, DELETE and TRUNCATE fail for %s', async (_who, urlName, refusal) => {
		const url = new URL(requireEnv(urlName));
		url.pathname = `/${scratch.name}`;
		const client = await connect(url.toString());
		try {
			for (const statement of statements) {
				const params = statement.includes('$1') ? [rowId] : [];
				await expect(client.query(statement, params), statement).rejects.toThrow(refusal);
			}
		} finally {
			await client.end();
		}
		const report = await verifyChain(scratch.app);
		expect(report).toMatchObject({ intact: true, rows: 1, sealed: 1 });
	});

	it('the superuser still meets the triggers (they hold whoever asks)', async () => {
		await scratch.asSuperuser(async (client) => {
			await expect(client.query(`delete from access_log where id = $1`, [rowId])).rejects.toThrow(
				/append-only: DELETE refused/
			);
		});
	});

	it.each([
		['DISABLE TRIGGER', `alter table access_log disable trigger access_log_no_update_delete`],
		['DISABLE TRIGGER ALL', `alter table access_log_seals disable trigger all`],
		['DROP TRIGGER', `drop trigger access_log_no_truncate on access_log`],
		[
			'replace the trigger function',
			`create or replace function seamwell_refuse_rewrite() returns trigger language plpgsql as 'begin return new; end'`
		],
		['take the log owner role', `set role seamwell_log_owner`],
		['hand the table to itself', `alter table access_log owner to current_user`]
	])('the owner login role cannot %s', async (_what, statement) => {
		const url = new URL(requireEnv('DATABASE_OWNER_URL'));
		url.pathname = `/${scratch.name}`;
		const client = await connect(url.toString());
		try {
			await expect(client.query(statement)).rejects.toThrow(/must be owner|permission denied/);
		} finally {
			await client.end();
		}
		const owners = await scratch.asSuperuser((su) =>
			su.query<{ relname: string; owner: string; login: boolean }>(
				`select c.relname, r.rolname as owner, r.rolcanlogin as login
				from pg_class c join pg_roles r on r.oid = c.relowner
				where c.relname in ('access_log', 'access_log_seals') order by c.relname`
			)
		);
		expect(owners.rows).toEqual([
			{ relname: 'access_log', owner: 'seamwell_log_owner', login: false },
			{ relname: 'access_log_seals', owner: 'seamwell_log_owner', login: false }
		]);
		const triggers = await scratch.asSuperuser((su) =>
			su.query<{ n: number }>(
				`select count(*)::int as n from pg_trigger
				where tgrelid in ('access_log'::regclass, 'access_log_seals'::regclass)
					and not tgisinternal and tgenabled = 'O'`
			)
		);
		expect(triggers.rows[0]!.n).toBe(4);
	});
});
