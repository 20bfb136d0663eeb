import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { getObject } from '../storage';
import { letterKey } from './letter';
import { referralEvents } from '../db/schema';
import {
	getConsentOverview,
	giveConsent,
	listConsents,
	requestConsent,
	withdrawConsent
} from '../consents/service';
import { getReferral, listLiveScreenings, listReferrals, transitionReferral } from './service';
import {
	makeCast,
	addConsent,
	addReferral,
	addScreening,
	logRows,
	mailsTo,
	makeClient,
	makeMember,
	problemOf,
	stateOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person,
	clientWithHistory as clientWithHistoryOf,
	draftReferral
} from '../../../../tests/support/referral-fixtures';

// Consent gating, withdrawal and the isolation of clinics, against the real database.
// Rules checked are Seamwell's own (DESIGN.md "Consent to share"), following GDPR Art. 7(3)
// (withdrawal as easy as giving, effective at once) and Art. 17(3)(b) (shared clinical
// records are kept, labelled).

let studio: Org;
let clinic: Org;
let otherClinic: Org;
let instructor: Person;
let physio: Person;

beforeAll(async () => {
	({ studio, clinic, otherClinic, instructor, physio } = await makeCast());
});

const clientWithHistory = () => clientWithHistoryOf(studio);
const draftFor = (client: ClientPerson, clinicId = clinic.id) =>
	draftReferral(instructor, client, clinicId);

describe('sending needs consent', () => {
	it('a draft needs none, and the clinic never sees it', async () => {
		const client = await clientWithHistory();
		const { id, state } = await draftFor(client);
		expect(state).toBe('draft');
		expect(await statusOf(getReferral(physio.caller, id))).toBe(404);
		const inbox = await listReferrals(physio.caller, { state: [], sort: 'date', limit: 100 });
		expect(inbox.items.map((i) => i.id)).not.toContain(id);
	});

	it('without consent: 409 consent-required with an offer to ask her, logged, nothing sent', async () => {
		const client = await clientWithHistory();
		const { id } = await draftFor(client);
		const problem = await problemOf(
			transitionReferral(instructor.caller, id, { to: 'sent', reason: null })
		);
		expect(problem.status).toBe(409);
		expect(problem.type).toMatch(/consent-required$/);
		expect(problem.requestConsent).toEqual({
			href: '/api/v1/consent-requests',
			method: 'POST',
			body: { clientId: client.clientId, clinicId: clinic.id }
		});
		expect(await stateOf(id)).toBe('draft');
		const [row] = await logRows(instructor.userId, 'referral.transitioned');
		expect(row).toMatchObject({ outcome: 'refused', targetId: id });
	});

	it('consent with referral alone, or for another clinic, or withdrawn, is not enough', async () => {
		const client = await clientWithHistory();
		const { id } = await draftFor(client);
		await addConsent(client, studio, clinic, ['referral']);
		await addConsent(client, studio, otherClinic, ['referral', 'screenings']);
		await addConsent(client, studio, clinic, ['referral', 'screenings'], {
			withdrawnAt: new Date(Date.now() - 1000)
		});
		await addConsent(client, studio, clinic, ['referral', 'screenings'], {
			startsAt: new Date(Date.now() - 10 * 86_400_000),
			endsAt: new Date(Date.now() - 86_400_000)
		});
		const problem = await problemOf(
			transitionReferral(instructor.caller, id, { to: 'sent', reason: null })
		);
		expect(problem.type).toMatch(/consent-required$/);
	});

	it('the instructor asks, the client consents, the referral goes with a snapshot and mails', async () => {
		const client = await clientWithHistory();
		const { id } = await draftFor(client);
		const since = new Date(Date.now() - 1000);

		const request = await requestConsent(instructor.caller, {
			clientId: client.clientId,
			clinicId: clinic.id
		});
		const [ask] = await mailsTo(client.email, since);
		expect(ask).toMatchObject({ kind: 'consent.requested' });
		expect(ask!.text).toContain(`/consents?request=${request.id}`);
		// No health details in mail: not her name, not the reason, not the clinic.
		expect(ask!.text).not.toContain(client.name);
		expect(ask!.text).not.toContain('finger');

		const overview = await getConsentOverview(client.caller);
		expect(overview.requests[0]).toMatchObject({
			id: request.id,
			clinicId: clinic.id,
			answeredAt: null
		});
		const given = await giveConsent(client.caller, {
			clinicId: clinic.id,
			scopes: ['referral', 'screenings']
		});
		const after = await getConsentOverview(client.caller);
		expect(after.requests[0]!.answeredAt).not.toBeNull();
		expect(after.grants[0]).toMatchObject({
			id: given.id,
			status: 'active',
			clinicName: clinic.name
		});
		expect(after.grants[0]!.history.map((h) => h.kind)).toEqual(['given']);

		expect(
			(await transitionReferral(instructor.caller, id, { to: 'sent', reason: null })).state
		).toBe('sent');
		// The referral letter was made from the copy the clinic received, and stored.
		const letter = await getObject(letterKey(id));
		expect(letter.subarray(0, 5).toString('latin1')).toBe('%PDF-');
		// The instructor who asked hears she can send now; her own words, no name or detail.
		const toldGiven = (await mailsTo(instructor.email, since)).filter(
			(m) => m.kind === 'consent.given'
		);
		expect(toldGiven).toHaveLength(1);
		expect(toldGiven[0]!.subject).toBe(
			'A client gave consent to share — you can now send the referral'
		);
		expect(toldGiven[0]!.text).not.toContain(client.name);
		expect(toldGiven[0]!.text).not.toContain(clinic.name);

		const [received] = await mailsTo(physio.email, since);
		expect(received).toMatchObject({
			kind: 'referral.received',
			subject: 'A referral for your clinic'
		});
		expect(received!.text).toContain(`/referrals/${id}`);
		expect(received!.text).not.toContain(client.name);

		const seen = await getReferral(physio.caller, id);
		expect(seen.viewer).toBe('clinic');
		expect(seen.screenings.map((s) => s.takenAt)).toEqual([
			'2025-03-01T10:00:00.000Z',
			'2025-04-01T10:00:00.000Z'
		]);
		expect(seen.client.name).toBe(client.name);
		expect(seen.redFlags).toEqual(['pelvic_heaviness']);
		expect(seen.sharing).toMatchObject({ status: 'active', endedAt: null, screeningsLive: true });
		const [read] = await logRows(physio.userId, 'referral.read');
		expect(read).toMatchObject({ outcome: 'success', targetId: id });

		// The physiotherapist accepts: the instructor is told.
		await transitionReferral(physio.caller, id, { to: 'accepted', reason: null });
		const told = await mailsTo(instructor.email, since);
		expect(told.map((m) => m.kind)).toContain('referral.accepted');
	});

	it('a screening recorded after sending is not in the snapshot, but live while consent lasts', async () => {
		const client = await clientWithHistory();
		await addConsent(client, studio, clinic, ['referral', 'screenings']);
		const { id } = await draftFor(client);
		await transitionReferral(instructor.caller, id, { to: 'sent', reason: null });
		await addScreening(client.clientId, new Date(Date.now() - 60_000), [2, 2, 1.5]);
		const detail = await getReferral(physio.caller, id);
		expect(detail.screenings).toHaveLength(2);
		const live = await listLiveScreenings(physio.caller, id, { limit: 25 });
		expect(live.items).toHaveLength(3);
		const [row] = await logRows(physio.userId, 'screening.read');
		expect(row).toMatchObject({ outcome: 'success', targetId: id });
	});
});

describe('withdrawing consent', () => {
	it('withdraws open referrals, refuses live reads (logged), keeps the labelled snapshot', async () => {
		const client = await clientWithHistory();
		const consentId = await addConsent(client, studio, clinic, ['referral', 'screenings']);
		const sent = (await draftFor(client)).id;
		const accepted = (await draftFor(client)).id;
		const draft = (await draftFor(client)).id;
		await transitionReferral(instructor.caller, sent, { to: 'sent', reason: null });
		await transitionReferral(instructor.caller, accepted, { to: 'sent', reason: null });
		await transitionReferral(physio.caller, accepted, { to: 'accepted', reason: null });
		const assessed = await addReferral({
			clientId: client.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state: 'assessed',
			physioId: physio.userId
		});
		const since = new Date(Date.now() - 1000);

		// The confirmation names what withdrawing will end: the two open referrals, not the rest.
		const before = await getConsentOverview(client.caller);
		const open = before.grants.find((g) => g.id === consentId)!.openReferrals;
		expect(open.map((r) => r.id).sort()).toEqual([sent, accepted].sort());
		expect(open.find((r) => r.id === accepted)).toMatchObject({
			state: 'accepted',
			physioName: physio.name
		});

		const result = await withdrawConsent(client.caller, consentId);
		expect(result.referralsWithdrawn).toBe(2);
		expect(await stateOf(sent)).toBe('withdrawn');
		expect(await stateOf(accepted)).toBe('withdrawn');
		expect(await stateOf(draft)).toBe('draft');
		expect(await stateOf(assessed)).toBe('assessed');
		const [event] = await db()
			.select()
			.from(referralEvents)
			.where(eq(referralEvents.referralId, accepted))
			.orderBy(referralEvents.id)
			.then((rows) => rows.slice(-1));
		expect(event).toMatchObject({
			fromState: 'accepted',
			toState: 'withdrawn',
			reason: 'consent withdrawn',
			actorUserId: client.userId
		});
		// Both sides are told sharing ended: the physio and the instructor who referred her.
		const toClinic = await mailsTo(physio.email, since);
		expect(toClinic.filter((m) => m.kind === 'referral.sharing_ended')).toHaveLength(2);
		const toInstructor = (await mailsTo(instructor.email, since)).filter(
			(m) => m.kind === 'referral.sharing_ended'
		);
		expect(toInstructor).toHaveLength(2);
		expect(toInstructor[0]!.subject).toBe('Sharing ended for one of your referrals');
		expect(toInstructor[0]!.text).not.toContain(client.name);
		const logged = await logRows(client.userId);
		expect(logged.map((r) => r.action)).toEqual(
			expect.arrayContaining(['consent.withdrawn', 'referral.transitioned'])
		);

		// The live history is refused, and the refusal is in the log.
		const refused = await problemOf(listLiveScreenings(physio.caller, sent, { limit: 25 }));
		expect(refused.status).toBe(403);
		expect(refused.detail).toMatch(/Sharing ended on \d{4}-\d{2}-\d{2}/);
		const [denied] = await logRows(physio.userId, 'screening.read');
		expect(denied).toMatchObject({ outcome: 'refused', targetId: sent });

		// What was shared stays readable, labelled with the date sharing ended.
		const kept = await getReferral(physio.caller, sent);
		expect(kept.screenings).toHaveLength(2);
		expect(kept.sharing.status).toBe('withdrawn');
		expect(kept.sharing.endedAt).toBe(result.withdrawnAt);
		expect(kept.sharing.screeningsLive).toBe(false);

		// The clinic can no longer act; the instructor cannot send the draft.
		expect(
			await statusOf(transitionReferral(physio.caller, assessed, { to: 'closed', reason: null }))
		).toBe(200);
		const blocked = await problemOf(
			transitionReferral(instructor.caller, draft, { to: 'sent', reason: null })
		);
		expect(blocked.type).toMatch(/consent-required$/);

		// Withdrawing twice is a conflict; the history shows both steps.
		expect(await statusOf(withdrawConsent(client.caller, consentId))).toBe(409);
		const overview = await getConsentOverview(client.caller);
		const grant = overview.grants.find((g) => g.id === consentId)!;
		expect(grant.status).toBe('withdrawn');
		expect(grant.history.map((h) => h.kind)).toEqual(['given', 'withdrawn']);
	});

	it('a clinic cannot act on a referral whose consent has run out', async () => {
		const client = await clientWithHistory();
		await addConsent(client, studio, clinic, ['referral', 'screenings'], {
			startsAt: new Date(Date.now() - 10 * 86_400_000),
			endsAt: new Date(Date.now() - 60_000)
		});
		const id = await addReferral({
			clientId: client.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state: 'sent',
			physioId: physio.userId
		});
		const problem = await problemOf(
			transitionReferral(physio.caller, id, { to: 'accepted', reason: null })
		);
		expect(problem.type).toMatch(/consent-required$/);
		expect(await stateOf(id)).toBe('sent');
	});

	it('only she may withdraw her consent; anyone else gets 404, logged', async () => {
		const client = await clientWithHistory();
		const other = await makeClient(studio, 'other-client');
		const consentId = await addConsent(client, studio, clinic);
		for (const who of [instructor, physio, other]) {
			expect(await statusOf(withdrawConsent(who.caller, consentId))).toBe(404);
			const [row] = await logRows(who.userId, 'consent.withdrawn');
			expect(row).toMatchObject({ outcome: 'refused', targetId: consentId });
		}
	});
});

describe('giving consent', () => {
	it('refuses an unknown clinic (422 /clinicId), an end in the past (422 /endsAt), and a second grant in force', async () => {
		const client = await clientWithHistory();
		const unknown = await problemOf(
			giveConsent(client.caller, { clinicId: studio.id, scopes: ['referral'] })
		);
		expect(unknown.errors).toEqual([{ pointer: '/clinicId', message: 'unknown clinic' }]);
		const past = await problemOf(
			giveConsent(client.caller, {
				clinicId: clinic.id,
				scopes: ['referral'],
				endsAt: new Date(Date.now() - 1000)
			})
		);
		expect(past.errors?.[0]?.pointer).toBe('/endsAt');
		expect((await getConsentOverview(client.caller)).grants).toHaveLength(0);
		await giveConsent(client.caller, { clinicId: clinic.id, scopes: ['referral', 'screenings'] });
		expect(
			await statusOf(giveConsent(client.caller, { clinicId: clinic.id, scopes: ['clearance'] }))
		).toBe(409);
	});

	it('is the client’s alone; the list shows a client her own and an admin her organisation’s', async () => {
		const client = await clientWithHistory();
		expect(
			await statusOf(giveConsent(instructor.caller, { clinicId: clinic.id, scopes: ['referral'] }))
		).toBe(403);
		const { id } = await giveConsent(client.caller, { clinicId: clinic.id, scopes: ['referral'] });
		const own = await listConsents(client.caller, { limit: 25 });
		expect(own.items.map((i) => i.id)).toEqual([id]);
		const clinicAdmin = await makeMember(clinic, 'admin');
		const theirs = await listConsents(clinicAdmin.caller, { limit: 100 });
		expect(theirs.items.map((i) => i.id)).toContain(id);
		const otherAdmin = await makeMember(otherClinic, 'admin');
		expect(
			(await listConsents(otherAdmin.caller, { limit: 100 })).items.map((i) => i.id)
		).not.toContain(id);
		expect(await statusOf(listConsents(instructor.caller, { limit: 25 }))).toBe(403);
	});
});
