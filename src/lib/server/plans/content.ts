import { asc, eq, inArray } from 'drizzle-orm';
import { judgeExercise } from '$lib/domain/plan-check';
import type { PlanClient, PlanItem } from '$lib/plans/types';
import { recordAccess, recordAccesses, type AuditAction } from '../audit';
import { loadEffectiveLimits } from '../clearance/limits';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import { clients, planClients, plans } from '../db/schema';
import { fieldProblem, notFound, ProblemError } from '../http/problem';
import { mayUseStudioRecord } from './policy';
import { type ClientRow, type PlanRow, firstName, todayUtc } from './shared';
import { libraryFor } from './library';

// ── Plans: loading and validating ────────────────────────────────────────────────────────

/** A plan the caller may use, or a logged 404 — the same whether it is missing or elsewhere. */
export async function planFor(caller: Caller, id: string, action: AuditAction): Promise<PlanRow> {
	const [row] = await db().select().from(plans).where(eq(plans.id, id));
	if (!row || !mayUseStudioRecord(caller.actor, row)) {
		return refuse(caller, action, notFound(), { type: 'plan', id });
	}
	return row;
}

export async function rosterOf(executor: Executor, planId: string): Promise<ClientRow[]> {
	const rows = await executor
		.select({ client: clients })
		.from(planClients)
		.innerJoin(clients, eq(clients.id, planClients.clientId))
		.where(eq(planClients.planId, planId))
		.orderBy(asc(planClients.position));
	return rows.map((r) => r.client);
}

export function toPlanClient(row: ClientRow): PlanClient {
	return { id: row.id, name: row.name, firstName: firstName(row.name), stage: row.stage };
}

/**
 * Every client must be a record of the plan's studio (else a logged 404: she may not know of
 * it) with intake consent; every exercise must be in the studio's library (else 404); each
 * swap must name a client of the plan and an exercise that is not itself blocked for her.
 */
export async function validateContent(
	tx: Executor,
	caller: Caller,
	action: AuditAction,
	studioId: string,
	clientIds: readonly string[],
	items: readonly PlanItem[],
	previous: readonly PlanItem[] = []
): Promise<ClientRow[]> {
	const rows = clientIds.length
		? await tx
				.select()
				.from(clients)
				.where(inArray(clients.id, [...clientIds]))
		: [];
	const byId = new Map(rows.map((r) => [r.id, r]));
	for (const id of clientIds) {
		const row = byId.get(id);
		if (!row || row.organisationId !== studioId) {
			return refuse(
				caller,
				action,
				notFound('No such client in your studio.'),
				{
					type: 'client',
					id
				},
				row?.id ?? null
			);
		}
	}
	const roster = clientIds.map((id) => byId.get(id)!);
	const withoutConsent = roster.filter((c) => !c.intakeConsentAt);
	if (withoutConsent.length > 0) {
		throw new ProblemError('intake-consent-required', {
			detail: `Record intake consent first for: ${withoutConsent.map((c) => c.name).join(', ')}.`,
			clientIds: withoutConsent.map((c) => c.id)
		});
	}

	const library = await libraryFor(tx, [studioId]);
	const known = new Map(library.map((e) => [e.id, e]));
	for (const [index, item] of items.entries()) {
		if (!known.has(item.exerciseId)) {
			throw new ProblemError('not-found', {
				detail: `Exercise ${index + 1} is not in your studio’s library.`,
				errors: [{ pointer: `/items/${index}/exerciseId`, message: 'no such exercise' }]
			});
		}
		for (const [clientId, swapId] of Object.entries(item.swaps)) {
			if (!clientIds.includes(clientId)) {
				throw fieldProblem(
					`/items/${index}/swaps/${clientId}`,
					'not a client of this plan',
					'A swap names a client who is not in this plan.'
				);
			}
			if (!known.has(swapId)) {
				throw new ProblemError('not-found', {
					detail: `The swap for exercise ${index + 1} is not in your studio’s library.`,
					errors: [{ pointer: `/items/${index}/swaps/${clientId}`, message: 'no such exercise' }]
				});
			}
		}
	}

	// New or changed swaps only: a swap kept from before is re-checked by the plan check itself.
	const before = new Map(previous.map((i) => [i.exerciseId, i.swaps]));
	const fresh: Array<{ index: number; clientId: string; swapId: string }> = [];
	for (const [index, item] of items.entries()) {
		for (const [clientId, swapId] of Object.entries(item.swaps)) {
			if (before.get(item.exerciseId)?.[clientId] !== swapId)
				fresh.push({ index, clientId, swapId });
		}
	}
	if (fresh.length > 0) {
		const limits = await loadEffectiveLimits(
			tx,
			[...new Set(fresh.map((f) => f.clientId))],
			todayUtc(),
			{ selfReports: 'shared' }
		);
		for (const f of fresh) {
			const client = byId.get(f.clientId)!;
			const clientLimits = limits.get(f.clientId);
			if (!clientLimits) continue;
			const verdict = judgeExercise(known.get(f.swapId)!, {
				clientId: f.clientId,
				stage: client.stage,
				limits: clientLimits
			});
			if (verdict.status === 'blocked') {
				throw fieldProblem(
					`/items/${f.index}/swaps/${f.clientId}`,
					`blocked for ${firstName(client.name)}: ${verdict.reason}`,
					`That swap is itself blocked for ${firstName(client.name)}: ${verdict.reason}`
				);
			}
		}
	}
	return roster;
}

export async function writeRoster(tx: Executor, planId: string, clientIds: readonly string[]) {
	await tx.delete(planClients).where(eq(planClients.planId, planId));
	if (clientIds.length > 0) {
		await tx
			.insert(planClients)
			.values(clientIds.map((clientId, position) => ({ planId, clientId, position })));
	}
}

export async function logPerClient(
	tx: Executor,
	caller: Caller,
	action: AuditAction,
	target: { type: string; id: string },
	clientIds: readonly string[]
) {
	if (clientIds.length === 0) {
		await recordAccess(tx, caller.access, { action, outcome: 'success', target });
		return;
	}
	await recordAccesses(
		tx,
		caller.access,
		clientIds.map((clientId) => ({ action, outcome: 'success' as const, target, clientId }))
	);
}
