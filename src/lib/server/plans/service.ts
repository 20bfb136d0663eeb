import { and, asc, desc, eq, inArray, isNotNull, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { SHIPPED_EXERCISES, type Exercise } from '$lib/domain/exercises/exercise';
import { STOP_SIGNS_TEXT } from '$lib/domain/exercises/library';
import {
	checkPlan,
	judgeExercise,
	type ClientWithLimits,
	type PlanCell
} from '$lib/domain/plan-check';
import type { ExerciseCreateInput, PlanCreateInput, PlanPatchInput } from '$lib/plans/schemas';
import type {
	ForYouEntry,
	OverriddenCell,
	PlanCheckChange,
	PlanCheckResult,
	PlanCheckSnapshot,
	PlanClient,
	PlanDetail,
	PlanItem,
	PlanSummary
} from '$lib/plans/types';
import { recordAccess, recordAccesses, type AuditAction } from '../audit';
import { loadEffectiveLimits } from '../clearance/limits';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import {
	clearanceReviewRequests,
	clearances,
	clients,
	memberships,
	organisations,
	planClients,
	planOverrides,
	plans,
	studioExercises,
	users
} from '../db/schema';
import { fieldProblem, notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { queueNotification } from '../mail/outbox';
import {
	instructorStudioIds,
	mayReadOwnPlans,
	mayUsePlans,
	mayUseStudioRecord,
	studioForNew
} from './policy';

// The exercise library and session plans. Every exported function begins by asserting a rule
// from ./policy.ts, does its work and its access-log rows in one transaction, and answers 404
// (logged) for a plan, exercise or client the caller may not know of. Levels come only from
// the clearance module's loadEffectiveLimits: nothing here derives a level.

type PlanRow = typeof plans.$inferSelect;
type ClientRow = typeof clients.$inferSelect;

const todayUtc = () => new Date().toISOString().slice(0, 10);
const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

async function refuseUse(caller: Caller, action: AuditAction): Promise<never> {
	return refuse(
		caller,
		action,
		new ProblemError('forbidden', {
			detail: 'Exercises and session plans are kept by the instructors of a studio.'
		})
	);
}

/**
 * Policy: mayUsePlans. Audit: a refusal only. For form actions, which check policy before they
 * read the form, so a person without access gets 404 rather than the form's 400.
 */
export async function assertMayPlan(caller: Caller): Promise<void> {
	if (!mayUsePlans(caller.actor)) await refuse(caller, 'access.denied', notFound());
}

// ── Library ─────────────────────────────────────────────────────────────────────────────

function customToExercise(row: typeof studioExercises.$inferSelect): Exercise {
	return {
		id: row.id,
		slug: row.slug,
		name: row.name,
		description: row.description,
		position: row.position,
		difficulty: row.difficulty as 1 | 2 | 3,
		categories: row.categories,
		alternativeIds: row.alternativeIds,
		custom: true,
		why: row.why,
		stopSigns: STOP_SIGNS_TEXT
	};
}

/** The shipped library and the studio's own exercises, shipped first. */
export async function libraryFor(
	executor: Executor,
	studioIds: readonly string[]
): Promise<Exercise[]> {
	if (studioIds.length === 0) return [...SHIPPED_EXERCISES];
	const rows = await executor
		.select()
		.from(studioExercises)
		.where(inArray(studioExercises.organisationId, [...studioIds]))
		.orderBy(asc(studioExercises.name));
	return [...SHIPPED_EXERCISES, ...rows.map(customToExercise)];
}

export interface ExerciseQuery {
	category?: Exercise['categories'][number];
	position?: Exercise['position'];
	difficulty?: number;
	q?: string;
	limit: number;
	cursor?: string;
}

const offsetCursor = z.object({ o: z.number().int().min(0) });

/** Policy: mayUsePlans (the shipped library and her studios' own). Audit: none — no client data. */
export async function listExercises(caller: Caller, query: ExerciseQuery): Promise<Page<Exercise>> {
	if (!mayUsePlans(caller.actor)) return refuseUse(caller, 'access.denied');
	const library = await libraryFor(db(), instructorStudioIds(caller.actor));
	const q = query.q?.trim().toLowerCase();
	const matching = library.filter(
		(e) =>
			(!query.category || e.categories.includes(query.category)) &&
			(!query.position || e.position === query.position) &&
			(!query.difficulty || e.difficulty === query.difficulty) &&
			(!q || e.name.toLowerCase().includes(q) || e.description.toLowerCase().includes(q))
	);
	const offset = decodeCursor(query.cursor, offsetCursor)?.o ?? 0;
	const rows = matching.slice(offset, offset + query.limit + 1);
	return toPage(rows, query.limit, () => ({ o: offset + query.limit }));
}

/** Policy: mayUsePlans (the whole library she can see). Audit: none — no client data. */
export async function exerciseLibrary(caller: Caller): Promise<Exercise[]> {
	if (!mayUsePlans(caller.actor)) return refuseUse(caller, 'access.denied');
	return libraryFor(db(), instructorStudioIds(caller.actor));
}

function slugify(name: string): string {
	const base = name
		.toLowerCase()
		.normalize('NFKD')
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-+|-+$/g, '')
		.slice(0, 60);
	return `studio-${base || 'exercise'}`;
}

/** Policy: studioForNew (an instructor of the studio). Audit: exercise.created (no client). */
export async function createExercise(
	caller: Caller,
	input: ExerciseCreateInput
): Promise<{ id: string }> {
	const studio = studioForNew(caller.actor);
	if (!studio) return refuseUse(caller, 'exercise.created');
	return db().transaction(async (tx) => {
		const library = await libraryFor(tx, [studio]);
		const known = new Set(library.map((e) => e.id));
		const missing = input.alternativeIds.findIndex((id) => !known.has(id));
		if (missing >= 0) {
			throw fieldProblem(
				`/alternativeIds/${missing}`,
				'no such exercise in your library',
				'An alternative names an exercise that is not in your studio’s library.'
			);
		}
		if (input.copiedFrom && !known.has(input.copiedFrom)) {
			throw fieldProblem('/copiedFrom', 'no such exercise', 'No such exercise to copy from.');
		}
		let slug = slugify(input.name);
		const taken = new Set(library.map((e) => e.slug));
		for (let n = 2; taken.has(slug); n++) slug = `${slugify(input.name)}-${n}`;
		const [row] = await tx
			.insert(studioExercises)
			.values({
				organisationId: studio,
				slug,
				name: input.name,
				description: input.description,
				position: input.position,
				difficulty: input.difficulty,
				categories: input.categories,
				alternativeIds: input.alternativeIds,
				why: input.why?.trim() ?? '',
				copiedFrom: input.copiedFrom ?? null,
				createdBy: caller.actor.userId
			})
			.returning({ id: studioExercises.id });
		await recordAccess(tx, caller.access, {
			action: 'exercise.created',
			outcome: 'success',
			target: { type: 'exercise', id: row!.id }
		});
		return { id: row!.id };
	});
}

// ── Plans: loading and validating ────────────────────────────────────────────────────────

/** A plan the caller may use, or a logged 404 — the same whether it is missing or elsewhere. */
async function planFor(caller: Caller, id: string, action: AuditAction): Promise<PlanRow> {
	const [row] = await db().select().from(plans).where(eq(plans.id, id));
	if (!row || !mayUseStudioRecord(caller.actor, row)) {
		return refuse(caller, action, notFound(), { type: 'plan', id });
	}
	return row;
}

async function rosterOf(executor: Executor, planId: string): Promise<ClientRow[]> {
	const rows = await executor
		.select({ client: clients })
		.from(planClients)
		.innerJoin(clients, eq(clients.id, planClients.clientId))
		.where(eq(planClients.planId, planId))
		.orderBy(asc(planClients.position));
	return rows.map((r) => r.client);
}

function toPlanClient(row: ClientRow): PlanClient {
	return { id: row.id, name: row.name, firstName: firstName(row.name), stage: row.stage };
}

/**
 * Every client must be a record of the plan's studio (else a logged 404: she may not know of
 * it) with intake consent; every exercise must be in the studio's library (else 404); each
 * swap must name a client of the plan and an exercise that is not itself blocked for her.
 */
async function validateContent(
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

async function writeRoster(tx: Executor, planId: string, clientIds: readonly string[]) {
	await tx.delete(planClients).where(eq(planClients.planId, planId));
	if (clientIds.length > 0) {
		await tx
			.insert(planClients)
			.values(clientIds.map((clientId, position) => ({ planId, clientId, position })));
	}
}

async function logPerClient(
	tx: Executor,
	caller: Caller,
	action: AuditAction,
	target: { type: string; id: string },
	clientIds: readonly string[]
) {
	if (clientIds.length === 0) {
		await recordAccess(tx, caller.access, { action, outcome: 'success', target });
	}
	for (const clientId of clientIds) {
		await recordAccess(tx, caller.access, { action, outcome: 'success', target, clientId });
	}
}

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
		for (const { plan } of page.items) {
			await recordAccess(tx, caller.access, {
				action: 'plan.listed',
				outcome: 'success',
				target: { type: 'plan', id: plan.id }
			});
		}
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

function conflict(current: number): ProblemError {
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

// ── The check, ready and override ────────────────────────────────────────────────────────

async function runCheck(
	tx: Executor,
	caller: Caller,
	row: PlanRow
): Promise<{ cells: PlanCell[]; roster: ClientRow[]; checkedAt: string }> {
	const roster = await rosterOf(tx, row.id);
	const ids = roster.map((c) => c.id);
	const [limits, library] = await Promise.all([
		loadEffectiveLimits(tx, ids, todayUtc(), { selfReports: 'shared' }),
		libraryFor(tx, [row.organisationId])
	]);
	const withLimits: ClientWithLimits[] = roster
		.filter((c) => limits.has(c.id))
		.map((c) => ({ clientId: c.id, stage: c.stage, limits: limits.get(c.id)! }));
	// Reading each client's effective limits is reading her clearance: one row per client.
	for (const c of withLimits) {
		await recordAccess(tx, caller.access, {
			action: 'clearance.read',
			outcome: 'success',
			target: { type: 'plan', id: row.id },
			clientId: c.clientId
		});
	}
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
			for (const clientId of new Set(covered.map((c) => c.clientId))) {
				await recordAccess(tx, caller.access, {
					action: 'plan.overridden',
					outcome: 'success',
					target: { type: 'plan_override', id: overrideId },
					clientId
				});
			}
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

// ── Asking the physiotherapist to review ─────────────────────────────────────────────────

/**
 * Policy: an instructor of the client's studio (mayUseStudioRecord on her record). Audit:
 * clearance.review_requested. Goes to the clinic that set her current clearance: a dashboard
 * item and a mail without health details. No clearance → 409.
 */
export async function requestClearanceReview(
	caller: Caller,
	clientId: string,
	input: { exerciseId?: string; note: string }
): Promise<{ id: string }> {
	const [client] = await db().select().from(clients).where(eq(clients.id, clientId));
	if (!client || !mayUseStudioRecord(caller.actor, client)) {
		return refuse(
			caller,
			'clearance.review_requested',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id ?? null
		);
	}
	return db().transaction(async (tx) => {
		if (input.exerciseId) {
			const library = await libraryFor(tx, [client.organisationId]);
			if (!library.some((e) => e.id === input.exerciseId)) {
				throw new ProblemError('not-found', {
					detail: 'That exercise is not in your studio’s library.',
					errors: [{ pointer: '/exerciseId', message: 'no such exercise' }]
				});
			}
		}
		const [current] = await tx
			.select()
			.from(clearances)
			.where(eq(clearances.clientId, clientId))
			.orderBy(desc(clearances.setAt), desc(clearances.id))
			.limit(1);
		if (!current) {
			throw new ProblemError('conflict', {
				detail:
					'No clinician has set a clearance for her yet: refer her to a physiotherapist instead.'
			});
		}
		const [saved] = await tx
			.insert(clearanceReviewRequests)
			.values({
				clientId,
				studioId: client.organisationId,
				clinicId: current.clinicId,
				clearanceId: current.id,
				exerciseId: input.exerciseId ?? null,
				note: input.note,
				requestedBy: caller.actor.userId
			})
			.returning({ id: clearanceReviewRequests.id });
		const recipients = await tx
			.select({ email: users.email, id: users.id })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(
				and(
					eq(memberships.organisationId, current.clinicId),
					eq(memberships.role, 'physiotherapist'),
					eq(memberships.active, true),
					eq(users.active, true)
				)
			);
		const setter = recipients.filter((r) => r.id === current.setBy);
		for (const to of new Set((setter.length ? setter : recipients).map((r) => r.email))) {
			await queueNotification(tx, {
				to,
				kind: 'clearance.review_requested',
				link: `${config().ORIGIN}/physio`
			});
		}
		await recordAccess(tx, caller.access, {
			action: 'clearance.review_requested',
			outcome: 'success',
			target: { type: 'clearance_review_request', id: saved!.id },
			clientId
		});
		return { id: saved!.id };
	});
}

export interface ReviewRequestItem {
	id: string;
	clientId: string;
	clientName: string;
	studioName: string;
	exerciseName: string | null;
	note: string;
	createdAt: string;
	/** The clinic's newest referral for her, where a new clearance is set; null if none is open. */
	referralId: string | null;
}

/**
 * Policy: a physiotherapist of the clinic asked (the clinic set the clearance). Open requests
 * only: setting a new clearance for the client answers them. Audit: clearance.listed per
 * request — the list names clients.
 */
export async function listReviewRequests(caller: Caller): Promise<ReviewRequestItem[]> {
	const clinics = caller.actor.memberships
		.filter((m) => m.kind === 'clinic' && m.role === 'physiotherapist')
		.map((m) => m.organisationId);
	if (clinics.length === 0) return refuseUse(caller, 'clearance.listed');
	return db().transaction(async (tx) => {
		const rows = await tx
			.select({
				request: clearanceReviewRequests,
				clientName: clients.name,
				studioName: organisations.name,
				referralId: sql<string | null>`(
					select r.id from referrals r
					where r.client_id = ${clearanceReviewRequests.clientId}
						and r.clinic_id = ${clearanceReviewRequests.clinicId}
						and r.state in ('accepted', 'assessed')
					order by r.created_at desc limit 1)`
			})
			.from(clearanceReviewRequests)
			.innerJoin(clients, eq(clients.id, clearanceReviewRequests.clientId))
			.innerJoin(organisations, eq(organisations.id, clearanceReviewRequests.studioId))
			.where(
				and(
					inArray(clearanceReviewRequests.clinicId, clinics),
					isNull(clearanceReviewRequests.seenAt)
				)
			)
			.orderBy(desc(clearanceReviewRequests.createdAt))
			.limit(50);
		const exerciseNames = new Map(SHIPPED_EXERCISES.map((e) => [e.id, e.name]));
		await recordAccesses(
			tx,
			caller.access,
			rows.map((r) => ({
				action: 'clearance.listed' as const,
				outcome: 'success' as const,
				target: { type: 'clearance_review_request', id: r.request.id },
				clientId: r.request.clientId
			}))
		);
		return rows.map((r) => ({
			id: r.request.id,
			clientId: r.request.clientId,
			clientName: r.clientName,
			studioName: r.studioName,
			exerciseName: r.request.exerciseId ? (exerciseNames.get(r.request.exerciseId) ?? null) : null,
			note: r.request.note,
			createdAt: r.request.createdAt.toISOString(),
			referralId: r.referralId
		}));
	});
}

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
		for (const { plan } of rows) {
			await recordAccess(tx, caller.access, {
				action: 'plan.read',
				outcome: 'success',
				target: { type: 'plan', id: plan.id },
				clientId
			});
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
