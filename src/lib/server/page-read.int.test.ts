import { sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	clientWithHistory,
	logRows,
	makeMember,
	makeOrg,
	statusOf,
	type ClientPerson,
	type Person
} from '../../../tests/support/referral-fixtures';
import { getClient, getScreeningHistory } from './clients/service';
import { readClearance } from './clearance/clearance';
import { db } from './db';
import { readAsOne } from './page-read';
import { listClientReferrals } from './referrals/for-client';

// A page's services in one shared transaction, against the real database: the reads and their
// access-log rows in one transaction, the rows the same as when each service runs alone, a
// refusal kept when the page fails, and nothing usable once the transaction has ended.

/** The id of the transaction the code runs in (PostgreSQL's own, as a 32-bit xid). */
async function transactionId(): Promise<string> {
	const result = await db().execute<{ xid: string }>(
		sql`select (txid_current() % 4294967296)::text as xid`
	);
	return result.rows[0]!.xid;
}

/** The transaction that wrote each of her log rows, by action. */
async function writersOf(userId: string): Promise<Array<{ action: string; xid: string }>> {
	const result = await db().execute<{ action: string; xid: string }>(
		sql`select action, xmin::text as xid from access_log where actor_user_id = ${userId} order by id`
	);
	return result.rows;
}

describe('readAsOne: one transaction for a page load', () => {
	let instructor: Person;
	let other: Person;
	let client: ClientPerson;
	beforeAll(async () => {
		const studio = await makeOrg('studio');
		instructor = await makeMember(studio, 'instructor');
		other = await makeMember(await makeOrg('studio', 'other studio'), 'instructor', 'other');
		client = await clientWithHistory(studio);
	});

	const readPage = (who: Person) =>
		readAsOne(async () => {
			const before = await transactionId();
			const record = await getClient(who.caller, client.clientId);
			const history = await getScreeningHistory(who.caller, client.clientId);
			const referrals = await listClientReferrals(who.caller, client.clientId);
			const clearance = await readClearance(who.caller, client.clientId);
			return { before, after: await transactionId(), record, history, referrals, clearance };
		});

	it('runs every service in one transaction and writes their log rows in it', async () => {
		const page = await readPage(instructor);
		expect(page.record.id).toBe(client.clientId);
		expect(page.history.items).toHaveLength(2);
		expect(page.after).toBe(page.before);
		const rows = await writersOf(instructor.userId);
		expect(rows.map((r) => r.action).sort()).toEqual(
			['client.read', 'clearance.read', 'screening.read'].sort()
		);
		expect(new Set(rows.map((r) => r.xid))).toEqual(new Set([page.before]));
	});

	it('logs the same rows as the services do one by one, each in its own transaction', async () => {
		const alone = await makeMember(await makeOrg('studio', 'unused'), 'instructor', 'alone');
		// The same studio's instructor, without the shared transaction.
		const solo = {
			...alone,
			caller: {
				...instructor.caller,
				access: { ...instructor.caller.access, userId: alone.userId }
			}
		};
		await getClient(solo.caller, client.clientId);
		await getScreeningHistory(solo.caller, client.clientId);
		await listClientReferrals(solo.caller, client.clientId);
		await readClearance(solo.caller, client.clientId);
		const soloRows = await writersOf(alone.userId);
		expect(new Set(soloRows.map((r) => r.xid)).size).toBeGreaterThan(1);
		const sharedRows = await writersOf(instructor.userId);
		expect(soloRows.map((r) => r.action).sort()).toEqual(sharedRows.map((r) => r.action).sort());
	});

	it('keeps the refusal of a page that fails, and nothing else of it', async () => {
		expect(await statusOf(readPage(other))).toBe(404);
		const rows = await logRows(other.userId);
		expect(rows.map((r) => [r.action, r.outcome])).toEqual([['client.read', 'refused']]);
	});

	it('answers a burst of refused pages larger than the pool, each refusal recorded', async () => {
		// Each page holds a connection; a refusal written meanwhile would need a second one, and
		// more pages than the pool's ten connections would then wait on each other for ever.
		const stranger = await makeMember(await makeOrg('studio', 'burst'), 'instructor', 'burst');
		const statuses = await Promise.all(
			Array.from({ length: 25 }, () => statusOf(readPage(stranger)))
		);
		expect(statuses).toEqual(Array(25).fill(404));
		expect(await logRows(stranger.userId)).toHaveLength(25);
	});

	it('refuses use of the transaction once the page has ended', async () => {
		const leaked = await readAsOne(async () => db());
		expect(() => leaked.select()).toThrow(/already ended/);
		// Outside it, db() is the pool again.
		expect(await transactionId()).not.toBe(await transactionId());
	});
});
