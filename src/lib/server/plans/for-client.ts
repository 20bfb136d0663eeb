import { and, desc, eq, isNotNull, isNull } from 'drizzle-orm';
import { checkPlan } from '$lib/domain/plan-check';
import type { ForYouEntry } from '$lib/plans/types';
import { recordSuccesses } from '../audit';
import { loadEffectiveLimits } from '../clearance/limits';
import { type Caller } from '../context';
import { db } from '../db';
import { clients, planClients, plans } from '../db/schema';
import { mayReadOwnPlans } from './policy';
import { refuseUse, todayUtc } from './shared';
import { libraryFor } from './library';

// ── The client's own view ───────────────────────────────────────────────────────────────

/**
 * Policy: mayReadOwnPlans (the client herself). Audit: plan.read per ready plan, for her.
 * From plans marked ready that include her: her swaps and modifications only, never another
 * client's name or a reason.
 */
export async function plansForMe(caller: Caller): Promise<ForYouEntry[]> {
	if (!mayReadOwnPlans(caller.actor)) return refuseUse(caller, 'plan.read');
	const clientId = caller.actor.clientId;
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({ plan: plans, client: clients })
			.from(planClients)
			.innerJoin(plans, eq(plans.id, planClients.planId))
			.innerJoin(clients, eq(clients.id, planClients.clientId))
			.where(
				and(eq(planClients.clientId, clientId), isNotNull(plans.readyAt), isNull(plans.archivedAt))
			)
			.orderBy(desc(plans.scheduledFor), desc(plans.updatedAt))
			.limit(10);
		if (rows.length === 0) return [];
		const client = rows[0]!.client;
		const [limits, library] = await Promise.all([
			loadEffectiveLimits(tx, [clientId], todayUtc(), { selfReports: 'all' }),
			libraryFor(tx, [client.organisationId])
		]);
		const mine = limits.get(clientId);
		if (!mine) return [];
		const names = new Map(library.map((e) => [e.id, e.name]));
		const entries: ForYouEntry[] = [];
		await recordSuccesses(
			tx,
			caller.access,
			'plan.read',
			rows.map(({ plan }) => ({
				target: { type: 'plan', id: plan.id },
				clientId
			}))
		);
		for (const { plan } of rows) {
			const cells = checkPlan(
				{ items: plan.items },
				[{ clientId, stage: client.stage, limits: mine }],
				library
			);
			for (const cell of cells) {
				if (!cell.swapped && !cell.modification) continue;
				entries.push({
					planTitle: plan.title,
					scheduledFor: plan.scheduledFor?.toISOString() ?? null,
					exerciseName: names.get(cell.exerciseId) ?? 'An exercise',
					...(cell.swapped
						? { instead: names.get(cell.checkedExerciseId) ?? 'another exercise' }
						: {}),
					...(cell.modification ? { modification: cell.modification } : {})
				});
			}
		}
		return entries;
	});
}
