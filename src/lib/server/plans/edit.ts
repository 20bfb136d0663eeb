import { and, desc, eq, inArray, isNotNull, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { PlanCreateInput, PlanPatchInput } from '$lib/plans/schemas';
import type { PlanDetail, PlanItem, PlanSummary } from '$lib/plans/types';
import { recordSuccesses } from '../audit';
import { type Caller } from '../context';
import { db, type Executor } from '../db';
import { planClients, planOverrides, plans } from '../db/schema';
import { ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayUsePlans, studioForNew } from './policy';
import { type ClientRow, type PlanRow, refuseUse } from './shared';
import {
	logPerClient,
	planFor,
	rosterOf,
	toPlanClient,
	validateContent,
	writeRoster
} from './content';
import { instructorStudioIds } from '../scope';

// ── Plans: create, list, read, change ────────────────────────────────────────────────────

/** Policy: studioForNew (an instructor of the studio). Audit: plan.created, one row per client. */
export async function createPlan(caller: Caller, input: PlanCreateInput): Promise<{ id: string }> {
	const studio = studioForNew(caller.actor);
	if (!studio) return refuseUse(caller, 'plan.created');
	const items: PlanItem[] =
		input.items?.map((i) => ({ ...i, swaps: i.swaps ?? {} })) ??
		(input.exerciseIds ?? []).map((exerciseId) => ({ exerciseId, swaps: {} }));
	return db().transaction(async (tx) => {
		await validateContent(tx, caller, 'plan.created', studio, input.clientIds, items);
		const [row] = await tx
			.insert(plans)
			.values({
				organisationId: studio,
				title: input.title,
				scheduledFor: input.scheduledFor ? new Date(input.scheduledFor) : null,
				items,
				createdBy: caller.actor.userId,
				updatedBy: caller.actor.userId
			})
			.returning({ id: plans.id });
		await writeRoster(tx, row!.id, input.clientIds);
		await logPerClient(tx, caller, 'plan.created', { type: 'plan', id: row!.id }, input.clientIds);
		return { id: row!.id };
	});
}

const planCursor = z.object({ u: z.string(), id: z.uuid() });

/** Policy: mayUsePlans (her studios' plans). Audit: plan.listed, one row per plan shown. */
export async function listPlans(
	caller: Caller,
	query: { archived?: 'true' | 'false'; limit: number; cursor?: string }
): Promise<Page<PlanSummary>> {
	if (!mayUsePlans(caller.actor)) return refuseUse(caller, 'plan.listed');
	const studios = instructorStudioIds(caller.actor);
	const after = decodeCursor(query.cursor, planCursor);
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({
				plan: plans,
				clientCount: sql<number>`(select count(*)::int from ${planClients} where ${planClients.planId} = ${plans.id})`
			})
			.from(plans)
			.where(
				and(
					inArray(plans.organisationId, studios),
					query.archived === 'true' ? isNotNull(plans.archivedAt) : isNull(plans.archivedAt),
					after
						? sql`(${plans.updatedAt}, ${plans.id}) < (${after.u}::timestamptz, ${after.id}::uuid)`
						: undefined
				)
			)
			.orderBy(desc(plans.updatedAt), desc(plans.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			u: last.plan.updatedAt.toISOString(),
			id: last.plan.id
		}));
		await recordSuccesses(
			tx,
			caller.access,
			'plan.listed',
			page.items.map(({ plan }) => ({
				target: { type: 'plan', id: plan.id }
			}))
		);
		return {
			items: page.items.map(({ plan, clientCount }) => ({
				id: plan.id,
				title: plan.title,
				scheduledFor: plan.scheduledFor?.toISOString() ?? null,
				clientCount,
				itemCount: plan.items.length,
				version: plan.version,
				ready: plan.readyAt !== null,
				archived: plan.archivedAt !== null,
				updatedAt: plan.updatedAt.toISOString()
			})),
			nextCursor: page.nextCursor
		};
	});
}

async function detailOf(tx: Executor, row: PlanRow, roster: ClientRow[]): Promise<PlanDetail> {
	const overrides = await tx
		.select()
		.from(planOverrides)
		.where(eq(planOverrides.planId, row.id))
		.orderBy(desc(planOverrides.createdAt));
	return {
		id: row.id,
		title: row.title,
		scheduledFor: row.scheduledFor?.toISOString() ?? null,
		clientIds: roster.map((c) => c.id),
		clients: roster.map(toPlanClient),
		items: row.items,
		version: row.version,
		readyAt: row.readyAt?.toISOString() ?? null,
		archivedAt: row.archivedAt?.toISOString() ?? null,
		overrides: overrides.map((o) => ({
			reason: o.reason,
			cells: o.cells,
			at: o.createdAt.toISOString(),
			planVersion: o.planVersion
		})),
		updatedAt: row.updatedAt.toISOString()
	};
}

/** Policy: mayUseStudioRecord (an instructor of the plan's studio). Audit: plan.read per client. */
export async function getPlan(caller: Caller, id: string): Promise<PlanDetail> {
	const row = await planFor(caller, id, 'plan.read');
	return db().transaction(async (tx) => {
		const roster = await rosterOf(tx, id);
		await logPerClient(
			tx,
			caller,
			'plan.read',
			{ type: 'plan', id },
			roster.map((c) => c.id)
		);
		return detailOf(tx, row, roster);
	});
}

export function conflict(current: number): ProblemError {
	return new ProblemError('conflict', {
		detail: `Someone saved this plan since you opened it (it is now at version ${current}). Reload it, then make your change again.`,
		currentVersion: current
	});
}

/**
 * Policy: mayUseStudioRecord (any instructor of the studio). Audit: plan.updated per client.
 * A save naming an older version answers 409 and changes nothing; any change clears "ready".
 */
export async function updatePlan(
	caller: Caller,
	id: string,
	patch: PlanPatchInput
): Promise<PlanDetail> {
	const existing = await planFor(caller, id, 'plan.updated');
	return db().transaction(async (tx) => {
		if (existing.version !== patch.version) throw conflict(existing.version);
		const currentRoster = await rosterOf(tx, id);
		const clientIds = patch.clientIds ?? currentRoster.map((c) => c.id);
		let items = (patch.items ?? existing.items).map((i) => ({ ...i, swaps: { ...i.swaps } }));
		// A client taken off the plan takes her swaps with her.
		for (const item of items) {
			for (const clientId of Object.keys(item.swaps)) {
				if (!clientIds.includes(clientId)) delete item.swaps[clientId];
			}
		}
		items = items.map((i) => ({ ...i, swaps: i.swaps ?? {} }));
		const roster = await validateContent(
			tx,
			caller,
			'plan.updated',
			existing.organisationId,
			clientIds,
			items,
			existing.items
		);
		const [row] = await tx
			.update(plans)
			.set({
				title: patch.title ?? existing.title,
				scheduledFor:
					patch.scheduledFor === undefined
						? existing.scheduledFor
						: patch.scheduledFor
							? new Date(patch.scheduledFor)
							: null,
				items,
				archivedAt:
					patch.archived === undefined
						? existing.archivedAt
						: patch.archived
							? (existing.archivedAt ?? new Date())
							: null,
				readyAt: null,
				readyBy: null,
				readyCheck: null,
				version: sql`${plans.version} + 1`,
				updatedBy: caller.actor.userId,
				updatedAt: new Date()
			})
			.where(and(eq(plans.id, id), eq(plans.version, patch.version)))
			.returning();
		if (!row) {
			const [now] = await tx.select({ version: plans.version }).from(plans).where(eq(plans.id, id));
			throw conflict(now?.version ?? patch.version);
		}
		if (patch.clientIds) await writeRoster(tx, id, clientIds);
		const touched = [...new Set([...currentRoster.map((c) => c.id), ...clientIds])];
		await logPerClient(tx, caller, 'plan.updated', { type: 'plan', id }, touched);
		return detailOf(tx, row, roster);
	});
}

/** Policy: mayUseStudioRecord. Audit: plan.created per client. A copy, not ready, version 1. */
export async function duplicatePlan(caller: Caller, id: string): Promise<{ id: string }> {
	const existing = await planFor(caller, id, 'plan.created');
	return db().transaction(async (tx) => {
		const roster = await rosterOf(tx, id);
		const [row] = await tx
			.insert(plans)
			.values({
				organisationId: existing.organisationId,
				title: `${existing.title} (copy)`.slice(0, 200),
				scheduledFor: null,
				items: existing.items,
				createdBy: caller.actor.userId,
				updatedBy: caller.actor.userId
			})
			.returning({ id: plans.id });
		await writeRoster(
			tx,
			row!.id,
			roster.map((c) => c.id)
		);
		await logPerClient(
			tx,
			caller,
			'plan.created',
			{ type: 'plan', id: row!.id },
			roster.map((c) => c.id)
		);
		return { id: row!.id };
	});
}
