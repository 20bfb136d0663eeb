import { beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { clearanceSchema, reviewWindow } from '$lib/clearance/schemas';
import { screeningInputSchema } from '$lib/clients/schemas';
import { recordScreening } from '../clients/service';
import { withdrawConsent } from '../consents/service';
import { config } from '../config';
import { createDatabase, db } from '../db';
import { clearances, outbox, referralEvents } from '../db/schema';
import {
	addConsent,
	addReferral,
	addScreening,
	logRows,
	makeCast,
	makeClient,
	problemOf,
	stateOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { readAssessment, recordAssessment } from './assessment';
import { readClearance, setClearance, todayUtc } from './clearance';
import { listReviewRequests, requestClearanceReview } from '../plans/service';
import { loadEffectiveLimits } from './limits';
import { listClearanceReviews, REMINDER_DAYS, sendReviewReminders } from './reviews';

// Who may record assessments and set and read clearances, supersession, withdrawal and the
// review reminder, against the real database. Rules are the product's own (issue 13,
// DESIGN.md "Consent to share"); the values are invented.

let studio: Org;
let clinic: Org;
let instructor: Person;
let physio: Person;
let otherPhysio: Person;

beforeAll(async () => {
	({ studio, clinic, instructor, physio, otherPhysio } = await makeCast());
});

const assessment = {
	points: [
		{
			position: 'above' as const,
			distanceCm: 3,
			restMm: 24,
			curlUpMm: 19,
			method: 'ultrasound' as const,
			depth: null,
			tension: 'soft' as const,
			doming: true
		}
	],
	hernia: 'none' as const,
	pelvicFloor: null,
	plan: 'Deep-core retraining; review in six weeks.'
};

function clearanceInput(overrides: Record<string, unknown> = {}) {
	return clearanceSchema.parse({
		categories: {
			loaded_flexion: 'hold',
			long_lever: 'hold',
			front_loaded: 'modify',
			loaded_rotation: 'cleared',
			loaded_extension: 'cleared',
			inversion: 'hold',
			high_pressure: 'hold',
			impact: 'hold',
			deep_stability: 'cleared'
		},
		modifications: { front_loaded: 'Plank on the forearms against a bench, five breaths' },
		notes: 'Keep the breath moving.',
		reviewOn: reviewWindow().first,
		...overrides
	});
}

/** A client with two screenings, full consent and a referral accepted by `physio`. */
async function acceptedCase(): Promise<{ client: ClientPerson; referralId: string }> {
	const client = await makeClient(studio);
	await addScreening(client.clientId, new Date('2025-03-01T10:00:00Z'), [2, 2.5, 2]);
	await addConsent(client, studio, clinic);
	const referralId = await addReferral({
		clientId: client.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		state: 'accepted',
		physioId: physio.userId
	});
	return { client, referralId };
}

describe('recording an assessment', () => {
	it('the assigned physiotherapist records it; the referral moves to assessed in the same step', async () => {
		const { referralId } = await acceptedCase();
		const first = await recordAssessment(physio.caller, referralId, assessment);
		expect(first.state).toBe('assessed');
		expect(await stateOf(referralId)).toBe('assessed');
		const events = await db()
			.select()
			.from(referralEvents)
			.where(eq(referralEvents.referralId, referralId));
		expect(events.map((e) => e.toState)).toEqual(['accepted', 'assessed']);
		// A later one is appended, never overwrites.
		const second = await recordAssessment(physio.caller, referralId, {
			...assessment,
			hernia: 'suspected'
		});
		const read = await readAssessment(physio.caller, referralId);
		expect(read.history.map((a) => a.id)).toEqual([second.id, first.id]);
		expect(read.current?.hernia).toBe('suspected');
		expect((await logRows(physio.userId, 'assessment.recorded')).length).toBeGreaterThanOrEqual(2);
	});

	it('another clinic gets 404, the studio 403 (reading and writing), a sent referral 409', async () => {
		const { referralId } = await acceptedCase();
		expect(await statusOf(recordAssessment(otherPhysio.caller, referralId, assessment))).toBe(404);
		expect(await statusOf(readAssessment(otherPhysio.caller, referralId))).toBe(404);
		expect(await statusOf(recordAssessment(instructor.caller, referralId, assessment))).toBe(403);
		expect(await statusOf(readAssessment(instructor.caller, referralId))).toBe(403);
		const client = await makeClient(studio);
		await addConsent(client, studio, clinic);
		const sent = await addReferral({
			clientId: client.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state: 'sent',
			physioId: physio.userId
		});
		expect(await statusOf(recordAssessment(physio.caller, sent, assessment))).toBe(409);
		expect(await stateOf(referralId)).toBe('accepted');
		expect((await logRows(otherPhysio.userId, 'assessment.recorded'))[0]?.outcome).toBe('refused');
	});
});

describe('setting and reading a clearance', () => {
	it('the assigned physiotherapist sets it; studio, client and clinic read it; others 404', async () => {
		const { client, referralId } = await acceptedCase();
		const { id } = await setClearance(physio.caller, client.clientId, clearanceInput());
		for (const reader of [instructor.caller, client.caller, physio.caller]) {
			const view = await readClearance(reader, client.clientId);
			expect(view.current?.id).toBe(id);
			expect(view.current?.referralId).toBe(referralId);
			expect(view.current?.setBy.id).toBe(physio.userId);
			expect(view.provisional).toBe(false);
			expect(view.effective.front_loaded.level).toBe('modify');
			expect(view.effective.front_loaded.by).toBe('clinician');
			expect(view.effective.loaded_rotation.level).toBe('cleared');
		}
		expect(await statusOf(readClearance(otherPhysio.caller, client.clientId))).toBe(404);
		expect(
			await statusOf(setClearance(otherPhysio.caller, client.clientId, clearanceInput()))
		).toBe(404);
		// The studio reads, never sets; neither does she.
		expect(await statusOf(setClearance(instructor.caller, client.clientId, clearanceInput()))).toBe(
			403
		);
		expect(await statusOf(setClearance(client.caller, client.clientId, clearanceInput()))).toBe(
			403
		);
		expect((await logRows(instructor.userId, 'clearance.read'))[0]?.outcome).toBe('success');
	});

	it('a new clearance supersedes the previous one; every version stays readable', async () => {
		const { client } = await acceptedCase();
		const first = await setClearance(physio.caller, client.clientId, clearanceInput());
		const second = await setClearance(
			physio.caller,
			client.clientId,
			clearanceInput({
				categories: { ...clearanceInput().categories, impact: 'cleared' },
				notes: 'Impact cleared after review.'
			})
		);
		const view = await readClearance(instructor.caller, client.clientId);
		expect(view.current?.id).toBe(second.id);
		expect(view.history.map((v) => v.id)).toEqual([second.id, first.id]);
		expect(view.history[1]?.supersededBy).toBe(second.id);
		expect(view.history[1]?.categories.impact).toBe('hold');
		expect(view.effective.impact.level).toBe('cleared');
		const [row] = await db().select().from(clearances).where(eq(clearances.id, second.id));
		expect(row?.supersedes).toBe(first.id);
	});

	it('without `clearance` in the consent, or after withdrawal, none can be set; the studio keeps the last one, labelled', async () => {
		const { client } = await acceptedCase();
		const { id } = await setClearance(physio.caller, client.clientId, clearanceInput());
		const [grant] = await db().query.consents.findMany({
			where: (c, { eq }) => eq(c.clientId, client.clientId)
		});
		await withdrawConsent(client.caller, grant!.id);
		// Her accepted referral moved to withdrawn with the consent: nothing left to clear under.
		const refused = await problemOf(setClearance(physio.caller, client.clientId, clearanceInput()));
		expect(refused.status).toBe(403);
		const view = await readClearance(instructor.caller, client.clientId);
		expect(view.current?.id).toBe(id);
		expect(view.current?.sharingEndedOn).toBe(todayUtc());
		expect(view.provisional).toBe(false);

		const narrow = await makeClient(studio);
		await addConsent(narrow, studio, clinic, ['referral', 'screenings']);
		await addReferral({
			clientId: narrow.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state: 'assessed',
			physioId: physio.userId
		});
		expect(await statusOf(setClearance(physio.caller, narrow.clientId, clearanceInput()))).toBe(
			409
		);
	});
});

describe('effective limits for many clients', () => {
	it('loads clients with and without a clearance in one call', async () => {
		const { client: cleared } = await acceptedCase();
		await setClearance(physio.caller, cleared.clientId, clearanceInput());
		const { client: provisional } = await acceptedCase();
		const limits = await loadEffectiveLimits(
			db(),
			[cleared.clientId, provisional.clientId, '00000000-0000-4000-8000-000000000000'],
			todayUtc()
		);
		expect([...limits.keys()].sort()).toEqual([cleared.clientId, provisional.clientId].sort());
		expect(limits.get(cleared.clientId)?.provisional).toBe(false);
		expect(limits.get(cleared.clientId)?.categories.inversion.level).toBe('hold');
		expect(limits.get(provisional.clientId)?.provisional).toBe(true);
		expect(limits.get(provisional.clientId)?.categories.inversion.by).not.toBe('clinician');
	});
});

describe('review dates', () => {
	it('the reminder is queued once, with two workers claiming at the same moment', async () => {
		const { client, referralId } = await acceptedCase();
		const today = todayUtc();
		const { id } = await setClearance(physio.caller, client.clientId, clearanceInput());
		// Set three weeks ago, due in REMINDER_DAYS days.
		const reviewOn = new Date(Date.now() + REMINDER_DAYS * 86_400_000).toISOString().slice(0, 10);
		await db()
			.update(clearances)
			.set({ reviewOn, setAt: new Date(Date.now() - 21 * 86_400_000) })
			.where(eq(clearances.id, id));
		const since = new Date();
		const second = createDatabase(config().DATABASE_URL, { max: 2 });
		try {
			const counts = await Promise.all([
				sendReviewReminders(db(), today),
				sendReviewReminders(second, today),
				sendReviewReminders(db(), today),
				sendReviewReminders(second, today)
			]);
			expect(counts.reduce((a, b) => a + b, 0)).toBeGreaterThanOrEqual(1);
		} finally {
			await second.$client.end();
		}
		const mails = (
			await db().select().from(outbox).where(eq(outbox.kind, 'clearance.review_due'))
		).filter((m) => m.createdAt >= since && m.text.includes(''));
		const mine = mails.filter((m) => [physio.email, instructor.email, client.email].includes(m.to));
		const to = mine.map((m) => m.to).sort();
		expect(to).toEqual([client.email, instructor.email, physio.email].sort());
		for (const mail of mine) {
			expect(mail.text).not.toContain(client.name);
			expect(mail.subject).not.toContain(client.name);
		}
		expect(mine.find((m) => m.to === physio.email)?.text).toContain(`/referrals/${referralId}`);
		// A later run finds nothing left to send.
		expect(await sendReviewReminders(db(), today)).toBe(0);
		const [row] = await db().select().from(clearances).where(eq(clearances.id, id));
		expect(row?.reminderSentAt).not.toBeNull();
	});

	it('both sides list clearances due within 14 days and overdue', async () => {
		const { client } = await acceptedCase();
		const { id } = await setClearance(physio.caller, client.clientId, clearanceInput());
		const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
		await db().update(clearances).set({ reviewOn: yesterday }).where(eq(clearances.id, id));
		for (const who of [instructor.caller, physio.caller]) {
			const item = (await listClearanceReviews(who)).find((r) => r.clearanceId === id);
			expect(item?.overdue).toBe(true);
		}
		expect(
			(await listClearanceReviews(otherPhysio.caller)).find((r) => r.clearanceId === id)
		).toBeUndefined();
		const view = await readClearance(instructor.caller, client.clientId);
		expect(view.reviewOverdue).toBe(true);
	});
});

describe('a sign that sends her to a doctor', () => {
	it('holds everything until a later screening records she was seen and the sign has gone', async () => {
		const client = await makeClient(studio);
		const sites = {
			above_navel: { widthFingers: 1, depth: 'shallow', tension: 'firm', doming: false },
			at_navel: { widthFingers: 1.5, depth: 'shallow', tension: 'firm', doming: false },
			below_navel: { widthFingers: 1, depth: 'shallow', tension: 'firm', doming: false }
		} as const;
		const input = (takenAt: Date, redFlags: 'late_bleeding'[], resolved: boolean | null) =>
			screeningInputSchema.parse({
				takenAt: takenAt.toISOString(),
				sites,
				redFlags,
				medicalSignResolved: resolved
			});
		await recordScreening(
			instructor.caller,
			client.clientId,
			input(new Date(Date.now() - 3 * 86_400_000), ['late_bleeding'], null)
		);
		const held = await readClearance(instructor.caller, client.clientId);
		expect(held.seeDoctorFirst).toBe(true);
		expect(held.effective.deep_stability.level).toBe('hold');
		await recordScreening(
			instructor.caller,
			client.clientId,
			input(new Date(Date.now() - 86_400_000), [], true)
		);
		const lifted = await readClearance(instructor.caller, client.clientId);
		expect(lifted.seeDoctorFirst).toBe(false);
		expect(lifted.effective.deep_stability.level).not.toBe('hold');
	});
});

describe('a studio asks the clinic to review a clearance', () => {
	it('the physio sees the open request with a link to the referral; a new clearance answers it', async () => {
		const { client, referralId } = await acceptedCase();
		await setClearance(physio.caller, client.clientId, clearanceInput());
		const { id } = await requestClearanceReview(instructor.caller, client.clientId, {
			note: 'She feels strong in class; could the curl-ups be looked at again?'
		});

		const open = await listReviewRequests(physio.caller);
		expect(open.find((r) => r.id === id)).toMatchObject({
			clientId: client.clientId,
			referralId,
			note: 'She feels strong in class; could the curl-ups be looked at again?'
		});
		// Another clinic's physiotherapist sees nothing of it.
		expect((await listReviewRequests(otherPhysio.caller)).some((r) => r.id === id)).toBe(false);

		await setClearance(physio.caller, client.clientId, clearanceInput());
		expect((await listReviewRequests(physio.caller)).some((r) => r.id === id)).toBe(false);
	});
});
