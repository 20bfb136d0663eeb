import { and, desc, eq, gte, inArray } from 'drizzle-orm';
import { ADVICE_RANK, type AdviceLevel } from '../../domain';
import { checkPlan } from '../../domain/plan-check';
import { recordAccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	homePractices,
	homePracticeSessions,
	selfChecks,
	selfCheckSharing
} from '../db/schema';
import { notFound } from '../http/problem';
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
