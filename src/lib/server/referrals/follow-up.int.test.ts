import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { listClientReferrals } from './for-client';
import { referralEvents, referrals } from '../db/schema';
import { requestConsent } from '../consents/service';
import {
	getReferral,
	listLiveScreenings,
	listReferrals,
	openReferral,
	transitionReferral
} from './service';
import {
	makeCast,
	addConsent,
	logRows,
	makeClient,
	makeMember,
	makeOrg,
	problemOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person,
	clientWithHistory as clientWithHistoryOf,
	draftReferral
} from '../../../../tests/support/referral-fixtures';

// Referrals once shared, against the real database: a second referral to the same clinic,
// the client's and her studio's view of her referrals, bad input that writes nothing, and two
// clinics isolated on every referral URL. Rules checked are Seamwell's own (DESIGN.md
// "Referral" and "Consent to share").

let studio: Org;
let clinic: Org;
let otherClinic: Org;
let instructor: Person;
let physio: Person;
let otherPhysio: Person;

beforeAll(async () => {
	({ studio, clinic, otherClinic, instructor, physio, otherPhysio } = await makeCast());
});

const clientWithHistory = () => clientWithHistoryOf(studio);
const draftFor = (client: ClientPerson, clinicId = clinic.id) =>
	draftReferral(instructor, client, clinicId);

describe('a second referral to the same clinic', () => {
	it('is refused with a link to the open one, allowed with a reason kept in its history', async () => {
		const client = await clientWithHistory();
		await addConsent(client, studio, clinic, ['referral', 'screenings']);
		const first = (await draftFor(client)).id;
		// A draft is not yet the clinic's business: a second draft beside it is fine.
		const secondDraft = (await draftFor(client)).id;
		await transitionReferral(instructor.caller, first, { to: 'sent', reason: null });

		const refused = await problemOf(draftFor(client));
		expect(refused.status).toBe(409);
		expect(refused.type).toMatch(/duplicate-referral$/);
		expect((refused as unknown as { openReferralId: string }).openReferralId).toBe(first);
		expect(refused.errors?.map((e) => e.pointer)).toEqual(['/duplicateReason']);

		// Another clinic is not a duplicate.
		expect(await statusOf(draftFor(client, otherClinic.id))).toBe(200);

		const { id } = await openReferral(instructor.caller, {
			clientId: client.clientId,
			clinicId: clinic.id,
			reason: 'A second look at the scar (invented).',
			urgency: 'routine',
			redFlags: [],
			duplicateReason: 'Separate question about her caesarean scar'
		});
		const [created] = await db()
			.select()
			.from(referralEvents)
			.where(eq(referralEvents.referralId, id));
		expect(created!.reason).toBe(
			'Second referral while one is open: Separate question about her caesarean scar'
		);
		expect(secondDraft).not.toBe(id);
	});
});

describe('her referrals, as her studio and she herself follow them', () => {
	it('the instructor sees every one with its state and the clinic’s note; she sees only sent ones; others 404', async () => {
		const client = await clientWithHistory();
		await addConsent(client, studio, clinic, ['referral', 'screenings']);
		const draft = (await draftFor(client)).id;
		const sent = (await draftFor(client, otherClinic.id)).id;
		const accepted = (await draftFor(client)).id;
		await transitionReferral(instructor.caller, accepted, { to: 'sent', reason: null });
		await transitionReferral(physio.caller, accepted, {
			to: 'accepted',
			reason: 'We will see her on Tuesday (invented).'
		});
		await db()
			.update(referrals)
			.set({ state: 'sent', sentAt: new Date() })
			.where(eq(referrals.id, sent));

		const studioView = await listClientReferrals(instructor.caller, client.clientId);
		expect(studioView.map((r) => r.id).sort()).toEqual([draft, sent, accepted].sort());
		expect(studioView.find((r) => r.id === accepted)).toMatchObject({
			state: 'accepted',
			clinicName: clinic.name,
			clinicNote: 'We will see her on Tuesday (invented).'
		});

		const herView = await listClientReferrals(client.caller, client.clientId);
		expect(herView.map((r) => r.id).sort()).toEqual([sent, accepted].sort());
		// Her Home shows only the newest, and logs only that one as read.
		const before = (await logRows(client.userId, 'referral.listed')).length;
		const newest = await listClientReferrals(client.caller, client.clientId, { limit: 1 });
		expect(newest.map((r) => r.id)).toEqual([accepted]);
		expect((await logRows(client.userId, 'referral.listed')).length).toBe(before + 1);

		const stranger = await makeMember(await makeOrg('studio', 'elsewhere'), 'instructor');
		expect(await statusOf(listClientReferrals(stranger.caller, client.clientId))).toBe(404);
		expect(await statusOf(listClientReferrals(physio.caller, client.clientId))).toBe(404);
		const other = await makeClient(studio, 'other');
		expect(await statusOf(listClientReferrals(other.caller, client.clientId))).toBe(404);
		const [refused] = await logRows(stranger.userId, 'referral.listed');
		expect(refused).toMatchObject({ outcome: 'refused' });
	});
});

describe('bad input writes nothing', () => {
	it('an unknown clinic, a physio of another clinic, a client of another studio → 422 naming the field', async () => {
		const client = await clientWithHistory();
		const elsewhere = await makeOrg('studio', 'elsewhere');
		const stranger = await makeClient(elsewhere, 'stranger');
		const base = {
			clientId: client.clientId,
			clinicId: clinic.id,
			physioId: null,
			reason: 'A reason',
			urgency: 'routine' as const,
			redFlags: []
		};
		const cases = [
			[{ ...base, clinicId: studio.id }, '/clinicId'],
			[{ ...base, physioId: otherPhysio.userId }, '/physioId'],
			[{ ...base, physioId: instructor.userId }, '/physioId'],
			[{ ...base, clientId: stranger.clientId }, '/clientId']
		] as const;
		for (const [input, pointer] of cases) {
			const problem = await problemOf(openReferral(instructor.caller, input));
			expect(problem.status).toBe(422);
			expect(problem.errors?.map((e) => e.pointer)).toEqual([pointer]);
		}
		const rows = await db().select().from(referrals).where(eq(referrals.clientId, client.clientId));
		expect(rows).toHaveLength(0);
		const foreign = await problemOf(
			requestConsent(instructor.caller, { clientId: stranger.clientId, clinicId: clinic.id })
		);
		expect(foreign.errors?.[0]?.pointer).toBe('/clientId');
	});
});

describe('two clinics are isolated on every referral URL', () => {
	it('the other clinic’s physiotherapist gets 404 and never a list row', async () => {
		const client = await clientWithHistory();
		await addConsent(client, studio, clinic, ['referral', 'screenings']);
		const { id } = await draftFor(client);
		await transitionReferral(instructor.caller, id, { to: 'sent', reason: null });
		expect(await statusOf(getReferral(otherPhysio.caller, id))).toBe(404);
		expect(await statusOf(listLiveScreenings(otherPhysio.caller, id, { limit: 25 }))).toBe(404);
		for (const to of ['accepted', 'declined', 'withdrawn', 'sent', 'assessed', 'closed'] as const) {
			expect(await statusOf(transitionReferral(otherPhysio.caller, id, { to, reason: 'x' }))).toBe(
				404
			);
		}
		const list = await listReferrals(otherPhysio.caller, { state: [], sort: 'date', limit: 100 });
		expect(list.items.map((i) => i.id)).not.toContain(id);
		const refusals = await logRows(otherPhysio.userId);
		expect(refusals.filter((r) => r.targetId === id).every((r) => r.outcome === 'refused')).toBe(
			true
		);
		expect(refusals.filter((r) => r.targetId === id).length).toBeGreaterThanOrEqual(8);
	});
});
