import { desc, eq, sql } from 'drizzle-orm';
import { selfCheckAdvice, selfCheckSymptoms, type AdviceLevel, type RedFlag } from '../../domain';
import type { Exercise } from '../../domain/exercises/exercise';
import { EXERCISE_LIBRARY } from '../../domain/exercises/library';
import { checkPlan, type PlanCell } from '../../domain/plan-check';
import type { HomePracticeInput, PracticeSessionInput } from '../../self-care/schemas';
import { recordAccess } from '../audit';
import { type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	homePractices,
	homePracticeReminders,
	homePracticeSessions,
	type HomePracticeItem
} from '../db/schema';
import { ProblemError } from '../http/problem';
import { libraryFor } from '../plans/service';
import { limitsFor, ownClient, managedClient } from './shared';

// ── Home practice ──────────────────────────────────────────────────────────────────────

export interface PracticeCard {
	exerciseId: string;
	name: string;
	reps: string | null;
	note: string | null;
	how: string;
	cue: string | null;
	stopSigns: string;
	modification: string | null;
	/** Her limits now hold this exercise: she sees "paused", her instructor a swap to make. */
	paused: boolean;
	pausedReason: string | null;
	alternativeName: string | null;
}

export function cardsOf(
	items: readonly HomePracticeItem[],
	cells: readonly PlanCell[],
	library: readonly Exercise[]
): PracticeCard[] {
	const byId = new Map(library.map((e) => [e.id, e]));
	return items.map((item, index) => {
		const exercise = byId.get(item.exerciseId);
		const cell = cells.find((c) => c.itemIndex === index);
		const entry = EXERCISE_LIBRARY.find((e) => e.slug === item.exerciseId);
		const blocked = !exercise || cell?.status === 'blocked';
		return {
			exerciseId: item.exerciseId,
			name: exercise?.name ?? 'An exercise no longer in the library',
			reps: item.reps,
			note: item.note,
			how: entry?.how ?? exercise?.description ?? '',
			cue: entry?.cue ?? null,
			stopSigns: exercise?.stopSigns ?? '',
			modification: cell?.modification ?? null,
			paused: blocked,
			pausedReason: blocked ? (cell?.reason ?? 'Not in the library') : null,
			alternativeName: cell?.alternativeExerciseId
				? (byId.get(cell.alternativeExerciseId)?.name ?? null)
				: null
		};
	});
}

/**
 * Policy: mayManageHomePractice. Audit: home_practice.set. Checked like a plan: an exercise
 * from another studio is 404; a blocked one is 409 naming the items, never silently dropped.
 */
export async function setHomePractice(
	caller: Caller,
	clientId: string,
	input: HomePracticeInput
): Promise<{ items: PracticeCard[] }> {
	const client = await managedClient(caller, clientId, 'home_practice.set');
	return db().transaction(async (tx) => {
		const library = await libraryFor(tx, [client.organisationId]);
		const known = new Set(library.map((e) => e.id));
		const missing = input.items.findIndex((item) => !known.has(item.exerciseId));
		if (missing >= 0) {
			throw new ProblemError('not-found', {
				detail: `No exercise ${input.items[missing]!.exerciseId} in this studio’s library.`,
				errors: [{ pointer: `/items/${missing}/exerciseId`, message: 'no such exercise here' }]
			});
		}
		// Lock her record so two instructors' saves check against the same limits in turn.
		await tx.execute(sql`select 1 from ${clients} where ${clients.id} = ${client.id} for update`);
		const limits = await limitsFor(tx, client, 'shared');
		const cells = checkPlan(
			{ items: input.items.map((item) => ({ exerciseId: item.exerciseId })) },
			[{ clientId: client.id, stage: client.stage, limits }],
			library
		);
		const blocked = cells.filter((cell) => cell.status === 'blocked');
		if (blocked.length > 0) {
			const names = new Map(library.map((e) => [e.id, e.name]));
			throw new ProblemError('conflict', {
				detail: `Her limits hold ${blocked.length === 1 ? 'an exercise' : `${blocked.length} exercises`}: ${blocked.map((c) => names.get(c.exerciseId)).join(', ')}. Swap ${blocked.length === 1 ? 'it' : 'them'} for what she may do.`,
				blocked: blocked.map((c) => ({
					index: c.itemIndex,
					exerciseId: c.exerciseId,
					name: names.get(c.exerciseId),
					reason: c.reason,
					alternativeExerciseId: c.alternativeExerciseId ?? null
				}))
			});
		}
		const items: HomePracticeItem[] = input.items.map((item) => ({
			exerciseId: item.exerciseId,
			reps: item.reps,
			note: item.note
		}));
		await tx
			.insert(homePractices)
			.values({
				clientId: client.id,
				organisationId: client.organisationId,
				items,
				setBy: caller.actor.userId
			})
			.onConflictDoUpdate({
				target: homePractices.clientId,
				set: { items, setBy: caller.actor.userId, updatedAt: new Date() }
			});
		await recordAccess(tx, caller.access, {
			action: 'home_practice.set',
			outcome: 'success',
			target: { type: 'client', id: client.id },
			clientId: client.id
		});
		return { items: cardsOf(items, cells, library) };
	});
}

export interface PracticeSessionView {
	id: string;
	doneAt: string;
	feltOk: boolean;
	note: string | null;
	/** Only to her, or to her studio while she shares her self-checks. */
	symptoms: RedFlag[] | null;
}

export interface OwnHomePractice {
	items: PracticeCard[];
	updatedAt: string | null;
	sessions: PracticeSessionView[];
	reminder: { on: boolean; nextDueOn: string | null };
	symptoms: RedFlag[];
}

/**
 * Policy: mayUseOwnSelfCare. Audit: home_practice.read. Her cards with cue and stop signs;
 * an item her limits now hold (her own reports always count here) shows as paused.
 */
export async function getOwnHomePractice(caller: Caller): Promise<OwnHomePractice> {
	const client = await ownClient(caller, 'home_practice.read');
	return db().transaction(async (tx) => {
		const [practice] = await tx
			.select()
			.from(homePractices)
			.where(eq(homePractices.clientId, client.id));
		const library = await libraryFor(tx, [client.organisationId]);
		const items = practice?.items ?? [];
		const limits = await limitsFor(tx, client, 'all');
		const cells = checkPlan(
			{ items: items.map((item) => ({ exerciseId: item.exerciseId })) },
			[{ clientId: client.id, stage: client.stage, limits }],
			library
		);
		const sessions = await tx
			.select()
			.from(homePracticeSessions)
			.where(eq(homePracticeSessions.clientId, client.id))
			.orderBy(desc(homePracticeSessions.doneAt))
			.limit(20);
		const [reminder] = await tx
			.select()
			.from(homePracticeReminders)
			.where(eq(homePracticeReminders.clientId, client.id));
		await recordAccess(tx, caller.access, {
			action: 'home_practice.read',
			outcome: 'success',
			target: { type: 'client', id: client.id },
			clientId: client.id
		});
		return {
			items: cardsOf(items, cells, library),
			updatedAt: practice?.updatedAt.toISOString() ?? null,
			sessions: sessions.map((s) => ({
				id: s.id,
				doneAt: s.doneAt.toISOString(),
				feltOk: s.feltOk,
				note: s.note,
				symptoms: s.symptoms
			})),
			reminder: { on: reminder !== undefined, nextDueOn: reminder?.nextDueOn ?? null },
			symptoms: selfCheckSymptoms(client.stage)
		};
	});
}

/**
 * Policy: mayUseOwnSelfCare. Audit: home_practice.session_recorded. "Something felt wrong"
 * carries her symptoms and gets the same advice as a self-check.
 */
export async function recordPracticeSession(
	caller: Caller,
	input: PracticeSessionInput
): Promise<{ id: string; advice: { level: AdviceLevel; text: string } | null }> {
	const client = await ownClient(caller, 'home_practice.session_recorded');
	const advice = input.feltOk ? null : selfCheckAdvice({ symptoms: input.symptoms });
	return db().transaction(async (tx) => {
		const [row] = await tx
			.insert(homePracticeSessions)
			.values({
				clientId: client.id,
				doneAt: input.doneAt,
				feltOk: input.feltOk,
				note: input.note,
				symptoms: input.symptoms,
				adviceLevel: advice?.level ?? null
			})
			.returning({ id: homePracticeSessions.id });
		await recordAccess(tx, caller.access, {
			action: 'home_practice.session_recorded',
			outcome: 'success',
			target: { type: 'home_practice_session', id: row!.id },
			clientId: client.id
		});
		return { id: row!.id, advice: advice ? { level: advice.level, text: advice.text } : null };
	});
}
