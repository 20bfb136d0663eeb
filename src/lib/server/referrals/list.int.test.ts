import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { referralListViews } from '../db/schema';
import { listReferrals, transitionReferral } from './service';
import {
	addConsent,
	addReferral,
	logRows,
	makeClient,
	makeMember,
	makeOrg,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';

// The inbox list: filters, sorting, search, pagination, and how its reads are logged. Each
// test uses a clinic of its own, so the lists hold exactly what the test put there.

let studio: Org;
let instructor: Person;
let client: ClientPerson;
let other: ClientPerson;

beforeAll(async () => {
	studio = await makeOrg('studio');
	instructor = await makeMember(studio, 'instructor');
	client = await makeClient(studio, 'hazel');
	other = await makeClient(studio, 'ingrid');
});

async function clinicWithInbox() {
	const clinic = await makeOrg('clinic');
	const physio = await makeMember(clinic, 'physiotherapist');
	await addConsent(client, studio, clinic);
	await addConsent(other, studio, clinic);
	const day = (n: number) => new Date(Date.UTC(2025, 4, n, 9));
	const make = (
		who: ClientPerson,
		state: 'draft' | 'sent' | 'accepted' | 'declined',
		urgency: 'routine' | 'soon',
		sentAt: Date
	) =>
		addReferral({
			clientId: who.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state,
			urgency,
			sentAt,
			physioId: physio.userId
		});
	const ids = {
		a: await make(client, 'sent', 'routine', day(1)),
		b: await make(client, 'sent', 'soon', day(2)),
		c: await make(other, 'accepted', 'routine', day(3)),
		d: await make(other, 'declined', 'soon', day(4)),
		draft: await make(client, 'draft', 'soon', day(5))
	};
	return { clinic, physio, ids };
}

const list = (who: Person, extra: Partial<Parameters<typeof listReferrals>[1]> = {}) =>
	listReferrals(who.caller, { state: [], sort: 'date', limit: 25, ...extra });

describe('the inbox list', () => {
	it('sorts by date (newest first) or by urgency, and never shows drafts to the clinic', async () => {
		const { physio, ids } = await clinicWithInbox();
		expect((await list(physio)).items.map((i) => i.id)).toEqual([ids.d, ids.c, ids.b, ids.a]);
		expect((await list(physio, { sort: 'urgency' })).items.map((i) => i.id)).toEqual([
			ids.d,
			ids.b,
			ids.c,
			ids.a
		]);
	});

	it('filters by state and searches by client name', async () => {
		const { physio, ids } = await clinicWithInbox();
		expect((await list(physio, { state: ['sent'] })).items.map((i) => i.id)).toEqual([
			ids.b,
			ids.a
		]);
		expect(
			(await list(physio, { state: ['accepted', 'declined'] })).items.map((i) => i.id)
		).toEqual([ids.d, ids.c]);
		const found = await list(physio, { q: other.name.slice(0, 9) });
		expect(found.items.map((i) => i.id)).toEqual([ids.d, ids.c]);
		expect(found.items[0]).toMatchObject({
			clientName: other.name,
			urgency: 'soon',
			state: 'declined'
		});
	});

	it('pages with a cursor in either sort, each row once', async () => {
		const { physio, ids } = await clinicWithInbox();
		for (const sort of ['date', 'urgency'] as const) {
			const seen: string[] = [];
			let cursor: string | undefined;
			do {
				const page = await list(physio, { sort, limit: 1, cursor });
				seen.push(...page.items.map((i) => i.id));
				cursor = page.nextCursor ?? undefined;
			} while (cursor);
			expect(seen).toHaveLength(4);
			expect(new Set(seen)).toEqual(new Set([ids.a, ids.b, ids.c, ids.d]));
		}
		expect(await statusOf(list(physio, { sort: 'urgency', cursor: 'bm90LW91cnM' }))).toBe(422);
	});

	it('is refused to people who neither refer nor receive', async () => {
		const clinic = await makeOrg('clinic');
		const admin = await makeMember(clinic, 'admin');
		expect(await statusOf(list(admin))).toBe(403);
		expect(await statusOf(list(client))).toBe(403);
	});
});

describe('logging list reads', () => {
	it('logs each referral shown; a background refresh logs only what is new or changed', async () => {
		const { physio, ids } = await clinicWithInbox();
		const count = async () => (await logRows(physio.userId, 'referral.listed')).length;

		await list(physio);
		expect(await count()).toBe(4);
		const rows = await logRows(physio.userId, 'referral.listed');
		expect(new Set(rows.map((r) => r.targetId))).toEqual(new Set([ids.a, ids.b, ids.c, ids.d]));
		expect(rows.every((r) => r.subjectKey !== null)).toBe(true);

		// Refreshing in the background with nothing changed: no new rows.
		await list(physio, { background: true });
		await list(physio, { background: true });
		expect(await count()).toBe(4);

		// One referral changes state: the next refresh logs that one alone.
		await transitionReferral(physio.caller, ids.a, { to: 'accepted', reason: null });
		await list(physio, { background: true });
		expect(await count()).toBe(5);
		expect((await logRows(physio.userId, 'referral.listed'))[0]!.targetId).toBe(ids.a);

		// A person asking (not a background refresh) is always logged.
		await list(physio);
		expect(await count()).toBe(9);
	});

	it('a read that finds nothing moved writes no list-view rows (open tabs do not queue on row locks)', async () => {
		const { physio, ids } = await clinicWithInbox();
		const views = () =>
			db()
				.select({ referralId: referralListViews.referralId, seenAt: referralListViews.seenAt })
				.from(referralListViews)
				.where(eq(referralListViews.userId, physio.userId));
		await list(physio);
		const first = new Map((await views()).map((v) => [v.referralId, v.seenAt.getTime()]));
		expect(first.size).toBe(4);
		await list(physio);
		await list(physio, { background: true });
		const again = new Map((await views()).map((v) => [v.referralId, v.seenAt.getTime()]));
		expect(again).toEqual(first);
		// A referral that moves is written back, so the next refresh does not log it again.
		await transitionReferral(physio.caller, ids.a, { to: 'accepted', reason: null });
		await list(physio);
		const moved = new Map((await views()).map((v) => [v.referralId, v.seenAt.getTime()]));
		expect(moved.get(ids.a)).not.toBe(first.get(ids.a));
		expect(moved.get(ids.b)).toBe(first.get(ids.b));
	});
});
