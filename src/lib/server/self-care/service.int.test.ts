import { randomUUID } from 'node:crypto';
import { and, eq, gte } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	MOVEMENT_CATEGORIES,
	type ClearanceLevel,
	type MovementCategory
} from '$lib/domain/movement';
import { practiceSessionSchema, selfCheckInputSchema } from '$lib/self-care/schemas';
import type { Caller } from '../context';
import { db } from '../db';
import {
	accessLog,
	clearances,
	clients,
	homePracticeReminders,
	homePractices,
	outbox,
	selfChecks,
	studioExercises
} from '../db/schema';
import { ProblemError } from '../http/problem';
import { readClearance } from '../clearance/clearance';
import { loadEffectiveLimits } from '../clearance/limits';
import {
	callerFor,
	makeOrganisation,
	makePerson
} from '../../../../tests/integration/people-fixtures';
import {
	clientSelfCare,
	getOwnHomePractice,
	listClientSelfChecks,
	listFollowUps,
	listOwnSelfChecks,
	markFollowedUp,
	recordPracticeSession,
	recordSelfCheck,
	sendPracticeReminders,
	setHomePractice,
	setPracticeReminder,
	setSelfCheckSharing,
	unsubscribeFromReminders,
	unsubscribeToken
} from './service';

// Self-checks and home practice against the real database: sharing on and off (the studio's
// 404 while off), who may read and write, bad input, and limits reaching home practice.

const DAY = 86_400_000;
const dayAgo = (weeks: number) => new Date(Date.now() - weeks * 7 * DAY).toISOString().slice(0, 10);

let studio: string;
let otherStudio: string;
let clinic: string;
let alice: Caller; // instructor of studio
let olga: Caller; // instructor of another studio
let physioId: string;

async function expectProblem(promise: Promise<unknown>, status: number) {
	const error = await promise.then(
		() => null,
		(e: unknown) => e
	);
	expect(error).toBeInstanceOf(ProblemError);
	const response = (error as ProblemError).toResponse();
	expect(response.status).toBe(status);
	return (await response.json()) as Record<string, unknown>;
}

/** A client of `studio` who signs in, `weeks` after a birth of the given kind (or pregnant). */
async function clientPerson(
	options: { weeks?: number; pregnant?: boolean; delivery?: 'vaginal' | 'caesarean' } = {}
): Promise<{ id: string; caller: Caller }> {
	const person = await makePerson();
	const birth = dayAgo(options.weeks ?? 20);
	const [row] = await db()
		.insert(clients)
		.values({
			organisationId: studio,
			userId: person.userId,
			name: `Test Client ${randomUUID().slice(0, 4)}`,
			stage: options.pregnant ? 'pregnant' : 'postpartum',
			dueDate: options.pregnant ? new Date(Date.now() + 60 * DAY).toISOString().slice(0, 10) : null,
			birthDate: options.pregnant ? null : birth,
			delivery: options.pregnant ? null : (options.delivery ?? 'vaginal'),
			postnatalCheckOn: options.pregnant ? null : birth,
			postnatalCleared: options.pregnant ? null : true,
			intakeConsentAt: new Date(Date.now() - DAY),
			intakeConsentMethod: 'signed_form'
		})
		.returning({ id: clients.id });
	return { id: row!.id, caller: await callerFor(person.userId) };
}

const felt = (widthFingers: number) => ({ widthFingers, deep: false, doming: false });
const sites = (w = 1) => ({ above_navel: felt(w), at_navel: felt(w), below_navel: felt(w) });
const input = (body: unknown) => selfCheckInputSchema.parse(body);

beforeAll(async () => {
	studio = await makeOrganisation('studio');
	otherStudio = await makeOrganisation('studio');
	clinic = await makeOrganisation('clinic');
	const a = await makePerson([{ organisationId: studio, role: 'instructor' }]);
	const o = await makePerson([{ organisationId: otherStudio, role: 'instructor' }]);
	const p = await makePerson([{ organisationId: clinic, role: 'physiotherapist' }]);
	alice = await callerFor(a.userId);
	olga = await callerFor(o.userId);
	physioId = p.userId;
});

describe('sharing self-checks', () => {
	it('is off by default: the instructor gets 404 until she shares, and again after she stops', async () => {
		const hana = await clientPerson();
		const saved = await recordSelfCheck(
			hana.caller,
			input({ takenAt: new Date().toISOString(), symptoms: [], sites: sites(2) })
		);
		// Sperstad 2016: 2 finger widths → show your instructor
		expect(saved.advice.level).toBe('show_instructor');
		expect((await listOwnSelfChecks(hana.caller)).shared).toBe(false);
		await expectProblem(listClientSelfChecks(alice, hana.id), 404);
		expect((await clientSelfCare(alice, hana.id)).selfChecks).toEqual([]);

		await setSelfCheckSharing(hana.caller, { studioId: studio, share: true });
		const seen = await listClientSelfChecks(alice, hana.id);
		expect(seen.map((c) => c.id)).toEqual([saved.id]);
		expect(seen[0]).toMatchObject({ selfReported: true, advice: { level: 'show_instructor' } });
		// Another studio's instructor never sees them, shared or not.
		await expectProblem(listClientSelfChecks(olga, hana.id), 404);

		await setSelfCheckSharing(hana.caller, { studioId: studio, share: false });
		await expectProblem(listClientSelfChecks(alice, hana.id), 404);
	});

	it('is per studio: another studio’s id is 404 and changes nothing', async () => {
		const bea = await clientPerson();
		await expectProblem(
			setSelfCheckSharing(bea.caller, { studioId: otherStudio, share: true }),
			404
		);
		expect((await listOwnSelfChecks(bea.caller)).shared).toBe(false);
	});

	it('records every read and write in the access log', async () => {
		const since = new Date(Date.now() - 1000);
		const cleo = await clientPerson();
		const { id } = await recordSelfCheck(
			cleo.caller,
			input({ takenAt: new Date().toISOString(), symptoms: ['leakage'] })
		);
		await setSelfCheckSharing(cleo.caller, { studioId: studio, share: true });
		await listClientSelfChecks(alice, cleo.id);
		const rows = await db()
			.select()
			.from(accessLog)
			.where(and(gte(accessLog.at, since), eq(accessLog.targetId, id)));
		expect(rows.map((r) => r.action).sort()).toEqual(['self_check.read', 'self_check.recorded']);
	});
});

describe('dashboard follow-ups', () => {
	const followUpIds = async (who: Caller, clientId: string) =>
		(await listFollowUps(who))
			.filter((f) => f.clientId === clientId)
			.map((f) => `${f.kind}:${f.id}`)
			.sort();

	it('a shared check and a practice that felt wrong stay until an instructor marks them followed up', async () => {
		const gia = await clientPerson();
		await setSelfCheckSharing(gia.caller, { studioId: studio, share: true });
		// Sperstad 2016: 2 finger widths → show your instructor
		const check = await recordSelfCheck(
			gia.caller,
			input({ takenAt: new Date().toISOString(), symptoms: [], sites: sites(2) })
		);
		await setHomePractice(alice, gia.id, {
			items: [{ exerciseId: 'heel-slides', reps: '8', note: null }]
		});
		const session = await recordPracticeSession(
			gia.caller,
			practiceSessionSchema.parse({ doneAt: new Date().toISOString(), feltOk: false })
		);
		const both = [`felt_wrong:${session.id}`, `self_check:${check.id}`].sort();
		expect(await followUpIds(alice, gia.id)).toEqual(both);
		// Another studio's instructor: 404; the client herself: 403; nothing changes.
		await expectProblem(markFollowedUp(olga, { kind: 'self_check', id: check.id }), 404);
		await expectProblem(markFollowedUp(gia.caller, { kind: 'felt_wrong', id: session.id }), 403);
		expect(await followUpIds(alice, gia.id)).toEqual(both);

		const done = await markFollowedUp(alice, { kind: 'self_check', id: check.id });
		await markFollowedUp(alice, { kind: 'felt_wrong', id: session.id });
		expect(await followUpIds(alice, gia.id)).toEqual([]);
		// Marking again keeps the first time.
		const again = await markFollowedUp(alice, { kind: 'self_check', id: check.id });
		expect(again.followedUpAt).toBe(done.followedUpAt);
	});

	it('a check she does not share is not the studio’s to mark: 404', async () => {
		const hal = await clientPerson();
		const check = await recordSelfCheck(
			hal.caller,
			input({ takenAt: new Date().toISOString(), symptoms: [], sites: sites(2) })
		);
		await expectProblem(markFollowedUp(alice, { kind: 'self_check', id: check.id }), 404);
		const [row] = await db().select().from(selfChecks).where(eq(selfChecks.id, check.id));
		expect(row!.followedUpAt).toBeNull();
	});
});

describe('who may write', () => {
	it('an instructor (not a client) cannot record a self-check or practice session: 404', async () => {
		await expectProblem(
			recordSelfCheck(alice, input({ takenAt: new Date().toISOString(), symptoms: [] })),
			404
		);
		await expectProblem(
			recordPracticeSession(
				alice,
				practiceSessionSchema.parse({ doneAt: new Date().toISOString(), feltOk: true })
			),
			404
		);
	});

	it('a client cannot set or read anyone’s home practice; another studio’s instructor gets 404', async () => {
		const dana = await clientPerson();
		const other = await clientPerson();
		await expectProblem(setHomePractice(dana.caller, other.id, { items: [] }), 404);
		await expectProblem(clientSelfCare(dana.caller, other.id), 404);
		await expectProblem(setHomePractice(olga, dana.id, { items: [] }), 404);
		await expectProblem(setHomePractice(alice, randomUUID(), { items: [] }), 404);
	});
});

describe('bad input', () => {
	const now = new Date().toISOString();
	it('refuses widths outside 0–6 or not in half steps, unknown symptoms and a future date', () => {
		for (const w of [-0.5, 6.5, 1.25]) {
			expect(
				selfCheckInputSchema.safeParse({ takenAt: now, symptoms: [], sites: sites(w) }).success
			).toBe(false);
		}
		expect(selfCheckInputSchema.safeParse({ takenAt: now, symptoms: ['sneezing'] }).success).toBe(
			false
		);
		const future = new Date(Date.now() + 3 * DAY).toISOString();
		expect(selfCheckInputSchema.safeParse({ takenAt: future, symptoms: [] }).success).toBe(false);
		expect(
			practiceSessionSchema.safeParse({ doneAt: now, feltOk: true, symptoms: ['leakage'] }).success
		).toBe(false);
	});

	it('refuses widths where the finger-width part is not offered, writing nothing', async () => {
		const pregnant = await clientPerson({ pregnant: true });
		const early = await clientPerson({ weeks: 5 });
		const caesarean = await clientPerson({ weeks: 10, delivery: 'caesarean' });
		for (const who of [pregnant, early, caesarean]) {
			const body = await expectProblem(
				recordSelfCheck(who.caller, input({ takenAt: now, symptoms: [], sites: sites(1) })),
				422
			);
			expect(body.errors).toEqual([expect.objectContaining({ pointer: '/sites' })]);
			const rows = await db().select().from(selfChecks).where(eq(selfChecks.clientId, who.id));
			expect(rows).toEqual([]);
		}
		// 6 weeks is offered (the postnatal check at about 6 weeks, UK CMO 2019 via NHS pages)
		const six = await clientPerson({ weeks: 6 });
		await recordSelfCheck(six.caller, input({ takenAt: now, symptoms: [], sites: sites(1) }));
		// A healed caesarean wound, by her own answer, is offered.
		await recordSelfCheck(
			caesarean.caller,
			input({ takenAt: now, symptoms: [], sites: sites(1), woundHealed: true })
		);
		// The symptom check is always offered.
		const { advice } = await recordSelfCheck(
			pregnant.caller,
			input({ takenAt: now, symptoms: ['reduced_fetal_movements'] })
		);
		expect(advice.level).toBe('emergency');
	});
});

describe('home practice', () => {
	it('refuses another studio’s exercise (404) and a blocked one (409, naming it), writing nothing', async () => {
		const ella = await clientPerson({ weeks: 8 });
		const [theirs] = await db()
			.insert(studioExercises)
			.values({
				organisationId: otherStudio,
				slug: `their-move-${randomUUID().slice(0, 4)}`,
				name: 'Their move',
				description: 'x',
				position: 'supine',
				difficulty: 1,
				categories: ['deep_stability'],
				alternativeIds: []
			})
			.returning({ id: studioExercises.id });
		await expectProblem(
			setHomePractice(alice, ella.id, {
				items: [{ exerciseId: theirs!.id, reps: null, note: null }]
			}),
			404
		);
		// 8 weeks after the birth: impact waits until 12 weeks (Goom et al. 2019)
		const body = await expectProblem(
			setHomePractice(alice, ella.id, {
				items: [
					{ exerciseId: 'heel-slides', reps: '8', note: null },
					{ exerciseId: 'star-jumps', reps: '10', note: null }
				]
			}),
			409
		);
		expect(body.detail).toContain('Star jumps');
		expect(body.blocked).toEqual([expect.objectContaining({ index: 1, exerciseId: 'star-jumps' })]);
		const rows = await db().select().from(homePractices).where(eq(homePractices.clientId, ella.id));
		expect(rows).toEqual([]);
	});

	it('self-reported symptoms hold studio-side only when she shares; in her own view always', async () => {
		const fay = await clientPerson({ weeks: 30 });
		await setHomePractice(alice, fay.id, {
			items: [
				{ exerciseId: 'heel-slides', reps: '8', note: null },
				{ exerciseId: 'jog-on-the-spot', reps: '1 min', note: null }
			]
		});
		// Leakage (Goom et al. 2019, secondary): high-pressure effort and impact wait.
		await recordPracticeSession(
			fay.caller,
			practiceSessionSchema.parse({
				doneAt: new Date().toISOString(),
				feltOk: false,
				symptoms: ['leakage']
			})
		);
		const own = await getOwnHomePractice(fay.caller);
		expect(own.items.map((i) => i.paused)).toEqual([false, true]);
		expect((await readClearance(fay.caller, fay.id)).effective.impact.by).toBe('self_report');
		expect((await readClearance(alice, fay.id)).effective.impact.level).toBe('no_limit');
		// Not shared: the studio's limits do not know it, so jogging may still be given.
		const studioView = await clientSelfCare(alice, fay.id);
		expect(studioView.practice.items.map((i) => i.paused)).toEqual([false, false]);
		expect(studioView.practice.feltWrong[0]?.symptoms).toBeNull();
		// Shared: the same hold reaches the studio, and giving jogging is refused.
		await setSelfCheckSharing(fay.caller, { studioId: studio, share: true });
		const shared = await clientSelfCare(alice, fay.id);
		expect(shared.practice.items.map((i) => i.paused)).toEqual([false, true]);
		expect(shared.practice.feltWrong[0]?.symptoms).toEqual(['leakage']);
		expect((await readClearance(alice, fay.id)).effective.impact).toMatchObject({
			level: 'hold',
			by: 'self_report'
		});
		// The plans and the client list read the same limits, with her shared reports.
		const today = new Date().toISOString().slice(0, 10);
		const studioSide = await loadEffectiveLimits(db(), [fay.id], today, { selfReports: 'shared' });
		expect(studioSide.get(fay.id)!.categories.impact).toMatchObject({
			level: 'hold',
			by: 'self_report'
		});
		const clinicSide = await loadEffectiveLimits(db(), [fay.id], today);
		expect(clinicSide.get(fay.id)!.categories.impact.level).toBe('no_limit');
		await expectProblem(
			setHomePractice(alice, fay.id, {
				items: [{ exerciseId: 'jog-on-the-spot', reps: null, note: null }]
			}),
			409
		);
	});

	it('an item shows paused at once after a clearance puts its category on hold', async () => {
		const gia = await clientPerson({ weeks: 30 });
		await setHomePractice(alice, gia.id, {
			items: [
				{ exerciseId: 'heel-slides', reps: '8', note: null },
				{ exerciseId: 'curl-up', reps: '5', note: 'Small lift only.' }
			]
		});
		expect((await getOwnHomePractice(gia.caller)).items.map((i) => i.paused)).toEqual([
			false,
			false
		]);
		const levels = Object.fromEntries(
			MOVEMENT_CATEGORIES.map((c) => [c, c === 'loaded_flexion' ? 'hold' : 'cleared'])
		) as Record<MovementCategory, ClearanceLevel>;
		await db()
			.insert(clearances)
			.values({
				clientId: gia.id,
				clinicId: clinic,
				levels,
				modifications: {},
				reviewOn: new Date(Date.now() + 30 * DAY).toISOString().slice(0, 10),
				setBy: physioId,
				stageAtSet: 'postpartum',
				knownUntil: new Date()
			});
		const own = await getOwnHomePractice(gia.caller);
		expect(own.items.map((i) => i.paused)).toEqual([false, true]);
		const studioView = await clientSelfCare(alice, gia.id);
		expect(studioView.practice.items[1]).toMatchObject({ paused: true });
		expect(studioView.practice.perWeek).toEqual([0, 0, 0, 0]);
	});
});

describe('practice reminders', () => {
	it('sends once when due, with no name or health detail, and stops from the signed link', async () => {
		const ivy = await clientPerson();
		const [record] = await db().select().from(clients).where(eq(clients.id, ivy.id));
		const state = await setPracticeReminder(ivy.caller, true);
		expect(state.on).toBe(true);
		const due = state.nextDueOn!;
		// Not yet due the day before; due on the day, and only once.
		const before = new Date(Date.parse(`${due}T00:00:00Z`) - DAY).toISOString().slice(0, 10);
		await sendPracticeReminders(db(), before);
		await sendPracticeReminders(db(), due);
		await sendPracticeReminders(db(), due);
		const mails = await db()
			.select()
			.from(outbox)
			.where(and(eq(outbox.to, ivy.caller.actor.email), eq(outbox.kind, 'practice.reminder')));
		expect(mails).toHaveLength(1);
		const text = mails[0]!.text;
		expect(text).not.toContain(record!.name);
		expect(text).not.toMatch(/finger|leak|bleed|symptom/i);
		expect(text).toContain(`/reminders/unsubscribe?c=${ivy.id}&t=${unsubscribeToken(ivy.id)}`);

		expect(await unsubscribeFromReminders(ivy.id, 'forged')).toBe(false);
		expect(
			await db()
				.select()
				.from(homePracticeReminders)
				.where(eq(homePracticeReminders.clientId, ivy.id))
		).toHaveLength(1);
		expect(await unsubscribeFromReminders(ivy.id, unsubscribeToken(ivy.id))).toBe(true);
		expect(
			await db()
				.select()
				.from(homePracticeReminders)
				.where(eq(homePracticeReminders.clientId, ivy.id))
		).toEqual([]);
	});
});
