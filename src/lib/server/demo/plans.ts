import { and, eq, inArray } from 'drizzle-orm';
import { SHIPPED_EXERCISES } from '../../domain/exercises/exercise';
import { checkPlan, judgeExercise, type ClientWithLimits } from '../../domain/plan-check';
import type { PlanItem } from '../../plans/types';
import { loadEffectiveLimits } from '../clearance/limits';
import type { Transaction } from '../db';
import { clients, planClients, plans } from '../db/schema';
import type { DemoOrganisationKey } from './scenario';

// Two demo plans in Linden Row Studio: a class of four and a private session. The class is
// tuned against the demo clients' real effective limits at seeding time so that it shows
// exactly one blocked cell and one modified cell: any other cell that is not ok gets the
// alternative the check proposes, as an instructor would swap it.

export const DEMO_CLASS_TITLE = 'Tuesday postnatal mat class';
export const DEMO_PRIVATE_TITLE = 'Private session — Maya';

const CLASS_CLIENTS = ['Hana Lindqvist', 'Clara Nwosu', 'Ines Farrow', 'Lena Haddad'];
const CLASS_ITEMS = [
	'back-lying-breath-deep-core',
	'heel-slides',
	'four-point-opposite-reach',
	'curl-up',
	'side-lying-clams',
	'bodyweight-squat'
];
const PRIVATE_ITEMS = [
	'seated-breath-deep-core',
	'side-lying-clams',
	'supported-bridge',
	'wall-push'
];

export async function seedDemoPlans(
	tx: Transaction,
	orgIds: Record<DemoOrganisationKey, string>,
	userIdsByEmail: Record<string, string>
): Promise<void> {
	const studio = orgIds.studio;
	const author = userIdsByEmail['instructor@studio.example'] ?? null;
	const today = new Date().toISOString().slice(0, 10);
	const rows = await tx
		.select()
		.from(clients)
		.where(
			and(
				eq(clients.organisationId, studio),
				inArray(clients.name, [...CLASS_CLIENTS, 'Maya Okonjo'])
			)
		);
	const byName = new Map(rows.map((r) => [r.name, r]));
	const roster = CLASS_CLIENTS.map((n) => byName.get(n)).filter((c) => c?.intakeConsentAt);
	const limits = await loadEffectiveLimits(
		tx,
		rows.map((r) => r.id),
		today
	);
	const withLimits: ClientWithLimits[] = roster.flatMap((c) =>
		limits.has(c!.id) ? [{ clientId: c!.id, stage: c!.stage, limits: limits.get(c!.id)! }] : []
	);

	const items: PlanItem[] = CLASS_ITEMS.map((exerciseId) => ({ exerciseId, swaps: {} }));
	items[3]!.reps = '6, slow';
	const byId = new Map(SHIPPED_EXERCISES.map((e) => [e.id, e]));
	let keptBlocked = false;
	let keptModified = false;
	for (const cell of checkPlan({ items }, withLimits, SHIPPED_EXERCISES)) {
		if (cell.status === 'ok') continue;
		if (cell.status === 'blocked' && !keptBlocked) {
			keptBlocked = true;
			continue;
		}
		if (cell.status === 'modify' && !keptModified) {
			keptModified = true;
			continue;
		}
		// Swap to a fully allowed exercise for her, the check's own alternative first.
		const client = withLimits.find((c) => c.clientId === cell.clientId)!;
		const candidates = [cell.alternativeExerciseId, ...SHIPPED_EXERCISES.map((e) => e.id)];
		const allowed = candidates.find(
			(id) => id && id !== cell.exerciseId && judgeExercise(byId.get(id)!, client).status === 'ok'
		);
		if (allowed) items[cell.itemIndex]!.swaps[cell.clientId] = allowed;
	}

	const created = await tx
		.insert(plans)
		.values([
			{
				organisationId: studio,
				title: DEMO_CLASS_TITLE,
				scheduledFor: nextWeekday(2, 18),
				items,
				createdBy: author,
				updatedBy: author
			},
			{
				organisationId: studio,
				title: DEMO_PRIVATE_TITLE,
				scheduledFor: nextWeekday(4, 10),
				items: PRIVATE_ITEMS.map((exerciseId) => ({ exerciseId, swaps: {} })),
				createdBy: author,
				updatedBy: author
			}
		])
		.returning({ id: plans.id });
	const maya = byName.get('Maya Okonjo');
	await tx
		.insert(planClients)
		.values([
			...roster.map((c, position) => ({ planId: created[0]!.id, clientId: c!.id, position })),
			...(maya?.intakeConsentAt ? [{ planId: created[1]!.id, clientId: maya.id, position: 0 }] : [])
		]);
}

/** The next given weekday (0 = Sunday) at the given hour, UTC. */
function nextWeekday(day: number, hour: number): Date {
	const d = new Date();
	d.setUTCHours(hour, 0, 0, 0);
	d.setUTCDate(d.getUTCDate() + ((day - d.getUTCDay() + 7) % 7 || 7));
	return d;
}
