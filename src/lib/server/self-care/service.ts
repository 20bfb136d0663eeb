import { createHmac, timingSafeEqual } from 'node:crypto';
import { and, desc, eq, gte, inArray, lte, sql } from 'drizzle-orm';
import {
	ADVICE_RANK,
	fingerCheckOffer,
	selfCheckAdvice,
	selfCheckSymptoms,
	type AdviceLevel,
	type EffectiveLimits,
	type FingerCheckOffer,
	type RedFlag,
	type SelfCheckSites,
	type Stage
} from '../../domain';
import type { Exercise } from '../../domain/exercises/exercise';
import { EXERCISE_LIBRARY } from '../../domain/exercises/library';
import { checkPlan, type PlanCell } from '../../domain/plan-check';
import type {
	HomePracticeInput,
	PracticeSessionInput,
	SelfCheckInputData
} from '../../self-care/schemas';
import { recordAccess, recordAccesses, systemContext } from '../audit';
import { loadEffectiveLimits } from '../clearance/limits';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db, type Database, type Executor } from '../db';
import {
	clients,
	homePractices,
	homePracticeReminders,
	homePracticeSessions,
	organisations,
	selfChecks,
	selfCheckSharing,
	users,
	type HomePracticeItem
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { queueMail } from '../mail/outbox';
import { NOTIFICATION_WORDS } from '../mail/notifications';
import { instructorStudioIds } from '../clients/policy';
import { libraryFor } from '../plans/service';
import { mayFollowUp, mayManageHomePractice, mayReadSelfChecks, mayUseOwnSelfCare } from './policy';

// The client's self-checks and home practice. Every exported function begins by asserting a
// rule from ./policy.ts; work and its access-log row share one transaction. Limits come only
// from `effectiveLimits` and home practice is checked only by `checkPlan`.

type ClientRow = typeof clients.$inferSelect;

const todayUtc = () => new Date().toISOString().slice(0, 10);
const DAY_MS = 86_400_000;
/** A practice reminder every 4 weeks. */
export const REMINDER_INTERVAL_DAYS = 28;

function addDays(day: string, days: number): string {
	return new Date(Date.parse(`${day}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

function fieldProblem(pointer: string, message: string): ProblemError {
	return new ProblemError('validation-failed', {
		detail: `1 field needs attention: ${pointer}`,
		errors: [{ pointer, message }]
	});
}

async function ownClient(caller: Caller, action: Parameters<typeof refuse>[1]): Promise<ClientRow> {
	if (!mayUseOwnSelfCare(caller.actor)) return refuse(caller, action, notFound());
	const [row] = await db().select().from(clients).where(eq(clients.id, caller.actor.clientId));
	if (!row) return refuse(caller, action, notFound());
	return row;
}

async function isShared(tx: Executor, client: Pick<ClientRow, 'id' | 'organisationId'>) {
	const [row] = await tx
		.select({ shared: selfCheckSharing.shared })
		.from(selfCheckSharing)
		.where(
			and(
				eq(selfCheckSharing.clientId, client.id),
				eq(selfCheckSharing.organisationId, client.organisationId)
			)
		);
	return row?.shared ?? false;
}

/**
 * Her effective limits, read by the one loader of `effectiveLimits`: with her self-reported
 * symptoms in her own view always (`all`), studio-side only while she shares (`shared`).
 */
async function limitsFor(
	tx: Executor,
	client: ClientRow,
	selfReports: 'all' | 'shared'
): Promise<EffectiveLimits> {
	const limits = await loadEffectiveLimits(tx, [client.id], todayUtc(), { selfReports });
	return limits.get(client.id)!;
}

// ── Self-checks ─────────────────────────────────────────────────────────────────────────

export interface SelfCheckView {
	id: string;
	takenAt: string;
	symptoms: RedFlag[];
	sites: SelfCheckSites | null;
	advice: { level: AdviceLevel; text: string };
	selfReported: true;
}

function toView(row: typeof selfChecks.$inferSelect): SelfCheckView {
	const advice = selfCheckAdvice({ symptoms: row.symptoms, sites: row.sites });
	return {
		id: row.id,
		takenAt: row.takenAt.toISOString(),
		symptoms: row.symptoms,
		sites: row.sites,
		advice: { level: row.adviceLevel, text: advice.text },
		selfReported: true
	};
}

export interface SelfCheckSetup {
	stage: Stage;
	studio: { id: string; name: string };
	shared: boolean;
	symptoms: RedFlag[];
	/** Whether the finger-width part is offered today, before any answer about the wound. */
	offer: FingerCheckOffer;
	caesarean: boolean;
	checks: SelfCheckView[];
}

/**
 * Policy: mayUseOwnSelfCare. Audit: self_check.read per check listed. Her self-checks, newest
 * first, with what the page needs to guide her: her symptom list, the offer, her sharing.
 */
export async function listOwnSelfChecks(caller: Caller): Promise<SelfCheckSetup> {
	const client = await ownClient(caller, 'self_check.read');
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(selfChecks)
			.where(eq(selfChecks.clientId, client.id))
			.orderBy(desc(selfChecks.takenAt))
			.limit(50);
		const [studio] = await tx
			.select({ id: organisations.id, name: organisations.name })
			.from(organisations)
			.where(eq(organisations.id, client.organisationId));
		const shared = await isShared(tx, client);
		await recordAccesses(
			tx,
			caller.access,
			rows.length > 0
				? rows.map((row) => ({
						action: 'self_check.read' as const,
						outcome: 'success' as const,
						target: { type: 'self_check', id: row.id },
						clientId: client.id
					}))
				: [
						{
							action: 'self_check.read',
							outcome: 'success',
							target: { type: 'client', id: client.id },
							clientId: client.id
						}
					]
		);
		return {
			stage: client.stage,
			studio: studio ?? { id: client.organisationId, name: 'Your studio' },
			shared,
			symptoms: selfCheckSymptoms(client.stage),
			offer: fingerCheckOffer(
				{
					stage: client.stage,
					birthDate: client.birthDate,
					delivery: client.delivery,
					woundHealed: null
				},
				todayUtc()
			),
			caesarean: client.delivery !== 'vaginal',
			checks: rows.map(toView)
		};
	});
}

/**
 * Policy: mayUseOwnSelfCare. Audit: self_check.recorded. Refuses finger widths where the
 * finger-width part is not offered (pregnancy, under 6 weeks, a healing caesarean wound).
 */
export async function recordSelfCheck(
	caller: Caller,
	input: SelfCheckInputData
): Promise<{ id: string; advice: { level: AdviceLevel; text: string } }> {
	const client = await ownClient(caller, 'self_check.recorded');
	const sites = input.sites ?? null;
	if (sites) {
		const offer = fingerCheckOffer(
			{
				stage: client.stage,
				birthDate: client.birthDate,
				delivery: client.delivery,
				woundHealed: input.woundHealed ?? null
			},
			input.takenAt.toISOString().slice(0, 10)
		);
		if (!offer.offered) {
			throw fieldProblem('/sites', `not offered: ${offer.text}`);
		}
	}
	const advice = selfCheckAdvice({ symptoms: input.symptoms, sites });
	return db().transaction(async (tx) => {
		const [row] = await tx
			.insert(selfChecks)
			.values({
				clientId: client.id,
				takenAt: input.takenAt,
				symptoms: input.symptoms,
				sites,
				woundHealed: input.woundHealed ?? null,
				adviceLevel: advice.level
			})
			.returning({ id: selfChecks.id });
		await recordAccess(tx, caller.access, {
			action: 'self_check.recorded',
			outcome: 'success',
			target: { type: 'self_check', id: row!.id },
			clientId: client.id
		});
		return { id: row!.id, advice: { level: advice.level, text: advice.text } };
	});
}

/**
 * Policy: mayUseOwnSelfCare, for her own studio only (another studio id is 404). Audit:
 * self_check.sharing_changed. One tap to start or stop.
 */
export async function setSelfCheckSharing(
	caller: Caller,
	input: { studioId: string; share: boolean }
): Promise<{ studioId: string; shared: boolean }> {
	const client = await ownClient(caller, 'self_check.sharing_changed');
	if (client.organisationId !== input.studioId) {
		return refuse(caller, 'self_check.sharing_changed', notFound(), {
			type: 'organisation',
			id: input.studioId
		});
	}
	return db().transaction(async (tx) => {
		await tx
			.insert(selfCheckSharing)
			.values({ clientId: client.id, organisationId: input.studioId, shared: input.share })
			.onConflictDoUpdate({
				target: [selfCheckSharing.clientId, selfCheckSharing.organisationId],
				set: { shared: input.share, changedAt: new Date() }
			});
		await recordAccess(tx, caller.access, {
			action: 'self_check.sharing_changed',
			outcome: 'success',
			target: { type: 'organisation', id: input.studioId },
			clientId: client.id
		});
		return { studioId: input.studioId, shared: input.share };
	});
}

/**
 * Policy: mayReadSelfChecks (an instructor of her studio, while she shares; else 404). Audit:
 * self_check.read per check. Marked self-reported; never part of the screenings.
 */
export async function listClientSelfChecks(
	caller: Caller,
	clientId: string
): Promise<SelfCheckView[]> {
	const [client] = await db().select().from(clients).where(eq(clients.id, clientId));
	const shared = client ? await isShared(db(), client) : false;
	if (!client || !mayReadSelfChecks(caller.actor, client, shared)) {
		return refuse(
			caller,
			'self_check.read',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(selfChecks)
			.where(eq(selfChecks.clientId, client.id))
			.orderBy(desc(selfChecks.takenAt))
			.limit(50);
		await recordAccesses(
			tx,
			caller.access,
			rows.map((row) => ({
				action: 'self_check.read' as const,
				outcome: 'success' as const,
				target: { type: 'self_check', id: row.id },
				clientId: client.id
			}))
		);
		return rows.map(toView);
	});
}

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

function cardsOf(
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
	const [client] = await db().select().from(clients).where(eq(clients.id, clientId));
	if (!client || !mayManageHomePractice(caller.actor, client)) {
		return refuse(
			caller,
			'home_practice.set',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
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

export interface ClientSelfCare {
	shared: boolean;
	selfChecks: SelfCheckView[];
	practice: {
		items: PracticeCard[];
		updatedAt: string | null;
		/** Sessions per week, the last 4 weeks, oldest first. */
		perWeek: number[];
		feltWrong: PracticeSessionView[];
	};
	library: { id: string; name: string }[];
}

/**
 * Policy: mayManageHomePractice; her self-checks only with mayReadSelfChecks. Audit:
 * home_practice.read, and self_check.read per check shown. Items her limits now hold show as
 * needing a swap.
 */
export async function clientSelfCare(caller: Caller, clientId: string): Promise<ClientSelfCare> {
	const [client] = await db().select().from(clients).where(eq(clients.id, clientId));
	if (!client || !mayManageHomePractice(caller.actor, client)) {
		return refuse(
			caller,
			'home_practice.read',
			notFound(),
			{ type: 'client', id: clientId },
			client?.id
		);
	}
	return db().transaction(async (tx) => {
		const shared = await isShared(tx, client);
		const readChecks = mayReadSelfChecks(caller.actor, client, shared);
		const [practice] = await tx
			.select()
			.from(homePractices)
			.where(eq(homePractices.clientId, client.id));
		const library = await libraryFor(tx, [client.organisationId]);
		const items = practice?.items ?? [];
		const limits = await limitsFor(tx, client, 'shared');
		const cells = checkPlan(
			{ items: items.map((item) => ({ exerciseId: item.exerciseId })) },
			[{ clientId: client.id, stage: client.stage, limits }],
			library
		);
		const since = new Date(Date.parse(`${todayUtc()}T00:00:00Z`) - 27 * DAY_MS);
		const sessions = await tx
			.select()
			.from(homePracticeSessions)
			.where(
				and(eq(homePracticeSessions.clientId, client.id), gte(homePracticeSessions.doneAt, since))
			)
			.orderBy(desc(homePracticeSessions.doneAt));
		const perWeek = [0, 0, 0, 0];
		for (const s of sessions) {
			const week = Math.floor((s.doneAt.getTime() - since.getTime()) / (7 * DAY_MS));
			if (week >= 0 && week < 4) perWeek[week]! += 1;
		}
		const checks = readChecks
			? await tx
					.select()
					.from(selfChecks)
					.where(eq(selfChecks.clientId, client.id))
					.orderBy(desc(selfChecks.takenAt))
					.limit(20)
			: [];
		await recordAccesses(tx, caller.access, [
			{
				action: 'home_practice.read',
				outcome: 'success',
				target: { type: 'client', id: client.id },
				clientId: client.id
			},
			...checks.map((row) => ({
				action: 'self_check.read' as const,
				outcome: 'success' as const,
				target: { type: 'self_check', id: row.id },
				clientId: client.id
			}))
		]);
		return {
			shared,
			selfChecks: checks.map(toView),
			practice: {
				items: cardsOf(items, cells, library),
				updatedAt: practice?.updatedAt.toISOString() ?? null,
				perWeek,
				feltWrong: sessions
					.filter((s) => !s.feltOk)
					.map((s) => ({
						id: s.id,
						doneAt: s.doneAt.toISOString(),
						feltOk: false,
						note: s.note,
						symptoms: shared ? s.symptoms : null
					}))
			},
			library: library.map((e) => ({ id: e.id, name: e.name }))
		};
	});
}

export interface FollowUp {
	clientId: string;
	clientName: string;
	kind: 'self_check' | 'felt_wrong';
	at: string;
	level: AdviceLevel | null;
}

/**
 * Policy: mayFollowUp. Audit: self_check.read / home_practice.read per item shown. For her
 * dashboard: shared self-checks at "show your instructor" or above, and practices that felt
 * wrong, from the last 14 days, in her studios.
 */
export async function listFollowUps(caller: Caller): Promise<FollowUp[]> {
	if (!mayFollowUp(caller.actor)) return refuse(caller, 'self_check.read', notFound());
	const studios = instructorStudioIds(caller.actor);
	const since = new Date(Date.now() - 14 * DAY_MS);
	return db().transaction(async (tx) => {
		const checks = await tx
			.select({
				id: selfChecks.id,
				clientId: selfChecks.clientId,
				name: clients.name,
				at: selfChecks.takenAt,
				level: selfChecks.adviceLevel
			})
			.from(selfChecks)
			.innerJoin(clients, eq(clients.id, selfChecks.clientId))
			.innerJoin(
				selfCheckSharing,
				and(
					eq(selfCheckSharing.clientId, clients.id),
					eq(selfCheckSharing.organisationId, clients.organisationId),
					eq(selfCheckSharing.shared, true)
				)
			)
			.where(
				and(
					inArray(clients.organisationId, studios),
					gte(selfChecks.takenAt, since),
					inArray(selfChecks.adviceLevel, [
						'emergency',
						'same_day',
						'see_clinician',
						'show_instructor'
					])
				)
			)
			.orderBy(desc(selfChecks.takenAt))
			.limit(20);
		const wrong = await tx
			.select({
				id: homePracticeSessions.id,
				clientId: homePracticeSessions.clientId,
				name: clients.name,
				at: homePracticeSessions.doneAt
			})
			.from(homePracticeSessions)
			.innerJoin(clients, eq(clients.id, homePracticeSessions.clientId))
			.where(
				and(
					inArray(clients.organisationId, studios),
					gte(homePracticeSessions.doneAt, since),
					eq(homePracticeSessions.feltOk, false)
				)
			)
			.orderBy(desc(homePracticeSessions.doneAt))
			.limit(20);
		await recordAccesses(tx, caller.access, [
			...checks.map((c) => ({
				action: 'self_check.read' as const,
				outcome: 'success' as const,
				target: { type: 'self_check', id: c.id },
				clientId: c.clientId
			})),
			...wrong.map((w) => ({
				action: 'home_practice.read' as const,
				outcome: 'success' as const,
				target: { type: 'home_practice_session', id: w.id },
				clientId: w.clientId
			}))
		]);
		const items: FollowUp[] = [
			...checks.map((c) => ({
				clientId: c.clientId,
				clientName: c.name,
				kind: 'self_check' as const,
				at: c.at.toISOString(),
				level: c.level
			})),
			...wrong.map((w) => ({
				clientId: w.clientId,
				clientName: w.name,
				kind: 'felt_wrong' as const,
				at: w.at.toISOString(),
				level: null
			}))
		];
		return items.sort(
			(a, b) =>
				(a.level ? ADVICE_RANK[a.level] : 9) - (b.level ? ADVICE_RANK[b.level] : 9) ||
				b.at.localeCompare(a.at)
		);
	});
}

// ── Reminders ──────────────────────────────────────────────────────────────────────────

/** The unsubscribe token: an HMAC of her record's id, so the link works without signing in. */
export function unsubscribeToken(clientId: string, secret = config().AUTH_SECRET): string {
	return createHmac('sha256', secret).update(`practice-reminder:${clientId}`).digest('base64url');
}

function tokenMatches(clientId: string, token: string): boolean {
	const expected = Buffer.from(unsubscribeToken(clientId));
	const given = Buffer.from(token);
	return expected.length === given.length && timingSafeEqual(expected, given);
}

/** Policy: mayUseOwnSelfCare. Audit: home_practice.reminder_changed. */
export async function setPracticeReminder(
	caller: Caller,
	on: boolean
): Promise<{ on: boolean; nextDueOn: string | null }> {
	const client = await ownClient(caller, 'home_practice.reminder_changed');
	return db().transaction(async (tx) => {
		let nextDueOn: string | null = null;
		if (on) {
			nextDueOn = addDays(todayUtc(), REMINDER_INTERVAL_DAYS);
			await tx
				.insert(homePracticeReminders)
				.values({ clientId: client.id, nextDueOn })
				.onConflictDoNothing();
			const [row] = await tx
				.select()
				.from(homePracticeReminders)
				.where(eq(homePracticeReminders.clientId, client.id));
			nextDueOn = row?.nextDueOn ?? nextDueOn;
		} else {
			await tx.delete(homePracticeReminders).where(eq(homePracticeReminders.clientId, client.id));
		}
		await recordAccess(tx, caller.access, {
			action: 'home_practice.reminder_changed',
			outcome: 'success',
			target: { type: 'client', id: client.id },
			clientId: client.id
		});
		return { on, nextDueOn };
	});
}

/**
 * Policy: a valid signed token for this record (no sign-in). Audit:
 * home_practice.reminder_changed, as the system. True when the link was good.
 */
export async function unsubscribeFromReminders(clientId: string, token: string): Promise<boolean> {
	if (!/^[0-9a-f-]{36}$/i.test(clientId) || !tokenMatches(clientId, token)) return false;
	return db().transaction(async (tx) => {
		const [client] = await tx
			.select({ id: clients.id })
			.from(clients)
			.where(eq(clients.id, clientId));
		if (!client) return true;
		await tx.delete(homePracticeReminders).where(eq(homePracticeReminders.clientId, clientId));
		await recordAccess(tx, systemContext, {
			action: 'home_practice.reminder_changed',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return true;
	});
}

/**
 * Background work: queues the practice reminders due today, each claimed by moving its due
 * day on 4 weeks in the transaction that queues it (sent once across processes). The mail
 * holds no name and no health detail; its unsubscribe link needs no sign-in. Audit:
 * home_practice.reminded, as the system.
 */
export async function sendPracticeReminders(
	database: Database,
	today = todayUtc()
): Promise<number> {
	const due = await database
		.select({ clientId: homePracticeReminders.clientId })
		.from(homePracticeReminders)
		.where(lte(homePracticeReminders.nextDueOn, today))
		.limit(100);
	const origin = config().ORIGIN;
	let sent = 0;
	for (const { clientId } of due) {
		const done = await database.transaction(async (tx) => {
			const [claimed] = await tx
				.update(homePracticeReminders)
				.set({ nextDueOn: addDays(today, REMINDER_INTERVAL_DAYS) })
				.where(
					and(
						eq(homePracticeReminders.clientId, clientId),
						lte(homePracticeReminders.nextDueOn, today)
					)
				)
				.returning();
			if (!claimed) return false;
			const [person] = await tx
				.select({ email: users.email })
				.from(clients)
				.innerJoin(users, eq(users.id, clients.userId))
				.where(and(eq(clients.id, clientId), eq(users.active, true)));
			if (!person) return false;
			const words = NOTIFICATION_WORDS['practice.reminder'];
			const stop = `${origin}/reminders/unsubscribe?c=${clientId}&t=${unsubscribeToken(clientId)}`;
			await queueMail(tx, {
				to: person.email,
				kind: 'practice.reminder',
				subject: words.subject,
				text: [
					words.line,
					'',
					'Sign in to Seamwell to see your practice:',
					'',
					`${origin}/practice`,
					'',
					'To stop these reminders (no sign-in needed):',
					stop,
					'',
					'This message holds no details on purpose: they stay in Seamwell.'
				].join('\n')
			});
			await recordAccess(tx, systemContext, {
				action: 'home_practice.reminded',
				outcome: 'success',
				target: { type: 'client', id: clientId },
				clientId
			});
			return true;
		});
		if (done) sent += 1;
	}
	return sent;
}
