import { and, desc, eq, gte, inArray, isNull, sql } from 'drizzle-orm';
import { ADVICE_RANK, type AdviceLevel } from '../../domain';
import { checkPlan } from '../../domain/plan-check';
import { recordAccess, recordAccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	homePractices,
	homePracticeSessions,
	selfChecks,
	selfCheckSharing
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { libraryFor } from '../plans/service';
import { mayFollowUp, mayReadSelfChecks } from './policy';
import { DAY_MS, isShared, limitsFor, todayUtc, managedClient } from './shared';
import { toView, type SelfCheckView } from './self-checks';
import { cardsOf, type PracticeCard, type PracticeSessionView } from './home-practice';
import { instructorStudioIds } from '../scope';

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
	const client = await managedClient(caller, clientId, 'home_practice.read');
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
	/** The self-check or practice session it is about. */
	id: string;
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
					isNull(selfChecks.followedUpAt),
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
					eq(homePracticeSessions.feltOk, false),
					isNull(homePracticeSessions.followedUpAt)
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
				id: c.id,
				clientId: c.clientId,
				clientName: c.name,
				kind: 'self_check' as const,
				at: c.at.toISOString(),
				level: c.level
			})),
			...wrong.map((w) => ({
				id: w.id,
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

/** Follow-ups belong to the instructors of a studio; anyone else is refused (403, logged). */
export async function assertMayFollowUp(
	caller: Caller,
	action: 'self_check.followed_up' | 'home_practice.followed_up' = 'self_check.followed_up',
	target?: { type: string; id: string }
): Promise<void> {
	if (mayFollowUp(caller.actor)) return;
	await refuse(
		caller,
		action,
		new ProblemError('forbidden', {
			detail: 'Follow-ups are for the instructors of the client’s studio.'
		}),
		target
	);
}

/**
 * Policy: mayFollowUp, on an item the dashboard would show her (a shared self-check or a
 * practice that felt wrong, of a client of her studios); anything else is a logged 404.
 * Audit: self_check.followed_up / home_practice.followed_up. Marking it again changes nothing.
 */
export async function markFollowedUp(
	caller: Caller,
	item: { kind: FollowUp['kind']; id: string }
): Promise<{ id: string; followedUpAt: string }> {
	const action =
		item.kind === 'self_check' ? 'self_check.followed_up' : 'home_practice.followed_up';
	const target = {
		type: item.kind === 'self_check' ? 'self_check' : 'home_practice_session',
		id: item.id
	};
	await assertMayFollowUp(caller, action, target);
	const studios = instructorStudioIds(caller.actor);
	const table = item.kind === 'self_check' ? selfChecks : homePracticeSessions;
	const [found] = await db()
		.select({
			clientId: table.clientId,
			organisationId: clients.organisationId,
			followedUpAt: table.followedUpAt,
			shared: sql<boolean>`exists (select 1 from self_check_sharing s
				where s.client_id = ${clients.id} and s.organisation_id = ${clients.organisationId}
				and s.shared)`
		})
		.from(table)
		.innerJoin(clients, eq(clients.id, table.clientId))
		.where(eq(table.id, item.id));
	const visible =
		found && studios.includes(found.organisationId) && (item.kind === 'felt_wrong' || found.shared);
	if (!visible) return refuse(caller, action, notFound(), target, found?.clientId);
	return db().transaction(async (tx) => {
		const [row] = await tx
			.update(table)
			.set({
				followedUpAt: sql`coalesce(${table.followedUpAt}, now())`,
				followedUpBy: sql`coalesce(${table.followedUpBy}, ${caller.actor.userId}::uuid)`
			})
			.where(eq(table.id, item.id))
			.returning({ followedUpAt: table.followedUpAt });
		await recordAccess(tx, caller.access, {
			action,
			outcome: 'success',
			target,
			clientId: found.clientId
		});
		return { id: item.id, followedUpAt: row!.followedUpAt!.toISOString() };
	});
}
