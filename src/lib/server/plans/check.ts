import { and, eq } from 'drizzle-orm';
import { checkPlan, type ClientWithLimits, type PlanCell } from '$lib/domain/plan-check';
import type {
	OverriddenCell,
	PlanCheckChange,
	PlanCheckResult,
	PlanCheckSnapshot
} from '$lib/plans/types';
import { recordAccess, recordSuccesses } from '../audit';
import { limitsForRecords } from '../clearance/limits';
import { type Caller } from '../context';
import { db, type Executor } from '../db';
import { planOverrides, plans } from '../db/schema';
import { ProblemError } from '../http/problem';
import { type ClientRow, type PlanRow, todayUtc } from './shared';
import { libraryFor } from './library';
import { logPerClient, planFor, rosterOf } from './content';

// ── The check, ready and override ────────────────────────────────────────────────────────

async function runCheck(
	tx: Executor,
	caller: Caller,
	row: PlanRow
): Promise<{ cells: PlanCell[]; roster: ClientRow[]; checkedAt: string }> {
	const roster = await rosterOf(tx, row.id);
	const [limits, library] = await Promise.all([
		limitsForRecords(tx, roster, todayUtc(), { selfReports: 'shared' }),
		libraryFor(tx, [row.organisationId])
	]);
	const withLimits: ClientWithLimits[] = roster
		.filter((c) => limits.has(c.id))
		.map((c) => ({ clientId: c.id, stage: c.stage, limits: limits.get(c.id)! }));
	// Reading each client's effective limits is reading her clearance: one row per client.
	await recordSuccesses(
		tx,
		caller.access,
		'clearance.read',
		withLimits.map((c) => ({
			target: { type: 'plan', id: row.id },
			clientId: c.clientId
		}))
	);
	return {
		cells: checkPlan({ items: row.items }, withLimits, library),
		roster,
		checkedAt: new Date().toISOString()
	};
}

const cellKey = (c: { clientId: string; itemIndex: number; exerciseId: string }) =>
	`${c.clientId}|${c.itemIndex}|${c.exerciseId}`;

async function overriddenKeys(tx: Executor, row: PlanRow): Promise<Set<string>> {
	const rows = await tx
		.select({ cells: planOverrides.cells })
		.from(planOverrides)
		.where(and(eq(planOverrides.planId, row.id), eq(planOverrides.planVersion, row.version)));
	return new Set(rows.flatMap((r) => r.cells.map(cellKey)));
}

function snapshot(cells: readonly PlanCell[], checkedAt: string): PlanCheckSnapshot {
	return {
		checkedAt,
		cells: cells.map((c) => ({
			clientId: c.clientId,
			itemIndex: c.itemIndex,
			exerciseId: c.checkedExerciseId,
			status: c.status
		}))
	};
}

function changesSince(
	before: PlanCheckSnapshot | null,
	cells: readonly PlanCell[]
): PlanCheckChange[] {
	if (!before) return [];
	const was = new Map(before.cells.map((c) => [cellKey(c), c.status]));
	return cells.flatMap((c) => {
		const prior = was.get(cellKey({ ...c, exerciseId: c.checkedExerciseId }));
		return prior && prior !== c.status
			? [
					{
						clientId: c.clientId,
						itemIndex: c.itemIndex,
						exerciseId: c.checkedExerciseId,
						was: prior,
						now: c.status
					}
				]
			: [];
	});
}

function withOverrides(cells: readonly PlanCell[], keys: Set<string>) {
	return cells.map((c) => ({
		...c,
		overridden:
			c.status === 'blocked' &&
			c.overridable &&
			keys.has(cellKey({ ...c, exerciseId: c.checkedExerciseId }))
	}));
}

/**
 * Policy: mayUseStudioRecord. Audit: clearance.read, one row per client of the plan. Always
 * from the clients' current effective limits, so a changed clearance shows at the next look.
 */
export async function checkPlanById(caller: Caller, id: string): Promise<PlanCheckResult> {
	const row = await planFor(caller, id, 'clearance.read');
	return db().transaction(async (tx) => {
		const { cells, checkedAt } = await runCheck(tx, caller, row);
		const keys = await overriddenKeys(tx, row);
		return {
			items: withOverrides(cells, keys),
			checkedAt,
			changes: changesSince(row.readyCheck, cells)
		};
	});
}

function blockedSummary(cells: readonly PlanCell[]) {
	return cells.map((c) => ({
		clientId: c.clientId,
		itemIndex: c.itemIndex,
		exerciseId: c.checkedExerciseId,
		reason: c.reason,
		overridable: c.overridable,
		alternativeExerciseId: c.alternativeExerciseId ?? null
	}));
}

/**
 * Policy: mayUseStudioRecord. Audit: clearance.read per client, plan.ready, and with an
 * override plan.overridden per client it covers (target: the override record, which names the
 * plan, the cells and the reason). A clinician's hold or a "see a doctor first" hold can never
 * be overridden: 409 naming those cells, nothing written.
 */
export async function markReady(
	caller: Caller,
	id: string,
	override?: { reason: string }
): Promise<{ ready: true; overrideId: string | null; overriddenCells: OverriddenCell[] }> {
	const row = await planFor(caller, id, 'plan.ready');
	return db().transaction(async (tx) => {
		const { cells, checkedAt } = await runCheck(tx, caller, row);
		const blocked = cells.filter((c) => c.status === 'blocked');
		let overrideId: string | null = null;
		let covered: OverriddenCell[] = [];
		if (blocked.length > 0) {
			if (!override) {
				throw new ProblemError('conflict', {
					detail: `${blocked.length} ${blocked.length === 1 ? 'cell is' : 'cells are'} blocked: swap or remove ${blocked.length === 1 ? 'it' : 'them'}${blocked.every((c) => c.overridable) ? ', or override the studio’s provisional limits with a written reason' : ''}.`,
					cells: blockedSummary(blocked)
				});
			}
			const refused = blocked.filter((c) => !c.overridable);
			if (refused.length > 0) {
				throw new ProblemError('conflict', {
					detail: `The studio cannot override ${refused.length === 1 ? 'this block' : 'these blocks'}: set by a clinician or a "see a doctor first" hold. Swap or remove the exercise, or ask the physiotherapist to review.`,
					cells: blockedSummary(refused)
				});
			}
			covered = blocked.map((c) => ({
				clientId: c.clientId,
				itemIndex: c.itemIndex,
				exerciseId: c.checkedExerciseId,
				categories: c.holds.map((h) => h.category)
			}));
			const [saved] = await tx
				.insert(planOverrides)
				.values({
					planId: id,
					planVersion: row.version,
					reason: override.reason,
					cells: covered,
					createdBy: caller.actor.userId
				})
				.returning({ id: planOverrides.id });
			overrideId = saved!.id;
			await recordSuccesses(
				tx,
				caller.access,
				'plan.overridden',
				[...new Set(covered.map((c) => c.clientId))].map((clientId) => ({
					target: { type: 'plan_override', id: overrideId! },
					clientId
				}))
			);
		}
		await tx
			.update(plans)
			.set({
				readyAt: new Date(),
				readyBy: caller.actor.userId,
				readyCheck: snapshot(cells, checkedAt)
			})
			.where(eq(plans.id, id));
		await recordAccess(tx, caller.access, {
			action: 'plan.ready',
			outcome: 'success',
			target: { type: 'plan', id }
		});
		return { ready: true as const, overrideId, overriddenCells: covered };
	});
}

/** Policy: mayUseStudioRecord. Audit: plan.printed, one row per client on the sheet. */
export async function recordPrint(caller: Caller, id: string): Promise<void> {
	await planFor(caller, id, 'plan.printed');
	await db().transaction(async (tx) => {
		const roster = await rosterOf(tx, id);
		await logPerClient(
			tx,
			caller,
			'plan.printed',
			{ type: 'plan', id },
			roster.map((c) => c.id)
		);
	});
}
