import { randomUUID } from 'node:crypto';
import { and, desc, eq, gte } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import {
	MOVEMENT_CATEGORIES,
	type ClearanceLevel,
	type MovementCategory
} from '$lib/domain/movement';
import type { Caller } from '../context';
import { db } from '../db';
import { accessLog, clearances, clients, planOverrides, plans } from '../db/schema';
import { ProblemError } from '../http/problem';
import {
	callerFor,
	makeOrganisation,
	makePerson
} from '../../../../tests/integration/people-fixtures';
import { checkPlanById, createPlan, getPlan, listPlans, markReady, updatePlan } from './service';

// Session plans against the real database: studio ownership (another studio's instructor gets
// 404, a colleague in the same studio may edit), the version check, and ready with override.

let studio: string;
let otherStudio: string;
let clinic: string;
let alice: Caller; // instructor
let beth: Caller; // another instructor of the same studio
let olga: Caller; // instructor of another studio
let clinicHeld: string; // client with a clinician's loaded_flexion hold
let screenHeld: string; // 8 weeks after the birth: impact held by the studio's provisional rules
let free: string; // client with no limits
let noConsent: string;

async function client(
	name: string,
	organisationId: string,
	consent = true,
	weeksPostpartum = 30
): Promise<string> {
	const birth = new Date(Date.now() - weeksPostpartum * 7 * 86_400_000).toISOString().slice(0, 10);
	const [row] = await db()
		.insert(clients)
		.values({
			organisationId,
			name,
			stage: 'postpartum',
			birthDate: birth,
			delivery: 'vaginal',
			postnatalCheckOn: birth,
			postnatalCleared: true,
			intakeConsentAt: consent ? new Date(Date.now() - 86_400_000) : null,
			intakeConsentMethod: consent ? 'signed_form' : null
		})
		.returning({ id: clients.id });
	return row!.id;
}

function levels(set: Partial<Record<MovementCategory, ClearanceLevel>>) {
	return Object.fromEntries(MOVEMENT_CATEGORIES.map((c) => [c, set[c] ?? 'cleared'])) as Record<
		MovementCategory,
		ClearanceLevel
	>;
}

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

beforeAll(async () => {
	studio = await makeOrganisation('studio');
	otherStudio = await makeOrganisation('studio');
	clinic = await makeOrganisation('clinic');
	const a = await makePerson([{ organisationId: studio, role: 'instructor' }]);
	const b = await makePerson([{ organisationId: studio, role: 'instructor' }]);
	const o = await makePerson([{ organisationId: otherStudio, role: 'instructor' }]);
	const physio = await makePerson([{ organisationId: clinic, role: 'physiotherapist' }]);
	alice = await callerFor(a.userId);
	beth = await callerFor(b.userId);
	olga = await callerFor(o.userId);
	clinicHeld = await client(`Cleo Held ${randomUUID().slice(0, 4)}`, studio);
	screenHeld = await client(`Sara Early ${randomUUID().slice(0, 4)}`, studio, true, 8);
	free = await client(`Fay Free ${randomUUID().slice(0, 4)}`, studio);
	noConsent = await client(`Nell None ${randomUUID().slice(0, 4)}`, studio, false);
	await db()
		.insert(clearances)
		.values({
			clientId: clinicHeld,
			clinicId: clinic,
			levels: levels({ loaded_flexion: 'hold' }),
			modifications: {},
			reviewOn: new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10),
			setBy: physio.userId,
			stageAtSet: 'postpartum',
			knownUntil: new Date()
		});
});

describe('plan permissions', () => {
	it('another studio’s instructor gets 404 for the plan and its check; nothing is written', async () => {
		const { id } = await createPlan(alice, {
			title: 'Mat class',
			clientIds: [free],
			exerciseIds: ['heel-slides']
		});
		await expectProblem(getPlan(olga, id), 404);
		await expectProblem(checkPlanById(olga, id), 404);
		await expectProblem(updatePlan(olga, id, { version: 1, title: 'Taken over' }), 404);
		const [row] = await db().select().from(plans).where(eq(plans.id, id));
		expect(row!.title).toBe('Mat class');
		const page = await listPlans(olga, { limit: 100 });
		expect(page.items.map((p) => p.id)).not.toContain(id);
	});

	it('refuses a client of another studio (404) and a client without intake consent, saving nothing', async () => {
		const elsewhere = await client('Otto Elsewhere', otherStudio);
		const before = await db().select().from(plans).where(eq(plans.organisationId, studio));
		await expectProblem(
			createPlan(alice, { title: 'X', clientIds: [free, elsewhere], exerciseIds: ['heel-slides'] }),
			404
		);
		await expectProblem(
			createPlan(alice, { title: 'X', clientIds: [noConsent], exerciseIds: ['heel-slides'] }),
			409
		);
		await expectProblem(
			createPlan(alice, { title: 'X', clientIds: [free], exerciseIds: ['no-such-exercise'] }),
			404
		);
		const after = await db().select().from(plans).where(eq(plans.organisationId, studio));
		expect(after.length).toBe(before.length);
	});

	it('another instructor of the same studio may open and edit; a stale version is 409', async () => {
		const { id } = await createPlan(alice, {
			title: 'Shared class',
			clientIds: [free],
			exerciseIds: ['heel-slides']
		});
		const opened = await getPlan(beth, id);
		expect(opened.version).toBe(1);
		const saved = await updatePlan(beth, id, { version: 1, title: 'Shared class, week 2' });
		expect(saved.version).toBe(2);
		// Alice still holds version 1: her save is refused and changes nothing.
		const body = await expectProblem(updatePlan(alice, id, { version: 1, title: 'Mine' }), 409);
		expect(body.currentVersion).toBe(2);
		expect((await getPlan(alice, id)).title).toBe('Shared class, week 2');
	});

	it('refuses a swap to an exercise that is itself blocked for her (422 with the reason)', async () => {
		const { id } = await createPlan(alice, {
			title: 'Swaps',
			clientIds: [clinicHeld],
			exerciseIds: ['double-leg-lower']
		});
		const body = await expectProblem(
			updatePlan(alice, id, {
				version: 1,
				items: [{ exerciseId: 'double-leg-lower', swaps: { [clinicHeld]: 'curl-up' } }]
			}),
			422
		);
		expect(JSON.stringify(body.errors)).toContain('Loaded spinal flexion on hold');
		expect((await getPlan(alice, id)).version).toBe(1);
	});
});

describe('check, ready and override', () => {
	it('blocks a curl-up for the client with a clinician’s hold and passes it for a client without limits', async () => {
		const { id } = await createPlan(alice, {
			title: 'Check',
			clientIds: [clinicHeld, free],
			exerciseIds: ['curl-up']
		});
		const since = new Date(Date.now() - 1000);
		const result = await checkPlanById(alice, id);
		const held = result.items.find((c) => c.clientId === clinicHeld)!;
		expect(held).toMatchObject({ status: 'blocked', by: 'clinician', overridable: false });
		expect(held.alternativeExerciseId).toBe('back-lying-breath-deep-core');
		expect(result.items.find((c) => c.clientId === free)!.status).toBe('ok');
		// one clearance read per client
		const reads = await db()
			.select()
			.from(accessLog)
			.where(
				and(
					eq(accessLog.action, 'clearance.read'),
					eq(accessLog.targetId, id),
					gte(accessLog.at, since)
				)
			);
		expect(reads).toHaveLength(2);
	});

	it('ready: 409 with the blocked cells; an override cannot cover a clinician’s hold', async () => {
		const { id } = await createPlan(alice, {
			title: 'Ready clinician',
			clientIds: [clinicHeld],
			exerciseIds: ['curl-up']
		});
		const plain = await expectProblem(markReady(alice, id), 409);
		expect(plain.cells).toHaveLength(1);
		const overridden = await expectProblem(markReady(alice, id, { reason: 'She feels fine' }), 409);
		expect(String(overridden.detail)).toMatch(/cannot override/);
		const [row] = await db().select().from(plans).where(eq(plans.id, id));
		expect(row!.readyAt).toBeNull();
		expect(await db().select().from(planOverrides).where(eq(planOverrides.planId, id))).toEqual([]);
	});

	it('ready with an override of a provisional hold: 200, the override row and its log row', async () => {
		const { id } = await createPlan(alice, {
			title: 'Ready provisional',
			clientIds: [screenHeld, free],
			exerciseIds: ['jog-on-the-spot', 'heel-slides']
		});
		const check = await checkPlanById(alice, id);
		const cell = check.items.find((c) => c.clientId === screenHeld && c.itemIndex === 0)!;
		// The provisional rules reach the check: impact waits until 12 weeks after the birth
		// (Goom T, Donnelly G, Brockwell E. Returning to running postnatal, 2019).
		expect(cell).toMatchObject({ status: 'blocked', overridable: true });
		const since = new Date(Date.now() - 1000);
		const result = await markReady(alice, id, {
			reason: 'Cleared by her GP in writing; small range'
		});
		expect(result.overrideId).not.toBeNull();
		expect(result.overriddenCells).toEqual([
			{ clientId: screenHeld, itemIndex: 0, exerciseId: 'jog-on-the-spot', categories: ['impact'] }
		]);
		const [override] = await db().select().from(planOverrides).where(eq(planOverrides.planId, id));
		expect(override!.reason).toBe('Cleared by her GP in writing; small range');
		const logged = await db()
			.select()
			.from(accessLog)
			.where(and(eq(accessLog.action, 'plan.overridden'), gte(accessLog.at, since)))
			.orderBy(desc(accessLog.id));
		expect(logged.find((r) => r.targetId === result.overrideId)).toMatchObject({
			targetType: 'plan_override',
			actorUserId: alice.actor.userId,
			outcome: 'success'
		});
		const after = await checkPlanById(alice, id);
		expect(
			after.items.find((c) => c.clientId === screenHeld && c.itemIndex === 0)!.overridden
		).toBe(true);
		expect((await getPlan(alice, id)).readyAt).not.toBeNull();
	});
});
