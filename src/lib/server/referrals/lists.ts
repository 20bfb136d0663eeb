import { and, asc, desc, eq, inArray, isNull, ne, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import { REFERRAL_STATES, type ReferralState } from '../../domain/referral';
import type { ReferralFilter } from '$lib/referrals/schemas';
import type { ReferralListItem } from '$lib/referrals/types';
import { recordSuccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import {
	clients,
	organisations,
	referralListViews,
	referrals,
	referralSnapshots,
	users
} from '../db/schema';
import { fieldProblem, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayListReferrals } from './policy';
import type { ReferralRow } from './shared';
import { instructorStudioIds, physioClinicIds } from '../scope';

// ── Lists ──────────────────────────────────────────────────────────────────────────────

const listCursor = z.object({
	s: z.enum(['date', 'urgency']),
	r: z.number().int().min(0).max(1),
	t: z.iso.datetime(),
	id: z.uuid()
});

export const studioOrg = alias(organisations, 'studio_org');
export const clinicOrg = alias(organisations, 'clinic_org');
export const physioUser = alias(users, 'physio_user');
export const creatorUser = alias(users, 'creator_user');

const sortAt = sql<Date>`coalesce(${referrals.sentAt}, ${referrals.createdAt})`;
const urgencyRank = sql<number>`(case when ${referrals.urgency} = 'soon' then 0 else 1 end)`;

function escapeLike(term: string): string {
	return term.replace(/[\\%_]/g, (c) => `\\${c}`);
}

/** Instructors see their studios' referrals; physiotherapists their clinics', never drafts. */
const clientNameSql = sql<string>`coalesce(${clients.name}, ${referralSnapshots.client}->>'name', 'Erased client')`;

function visibility(caller: Caller): SQL {
	const studios = instructorStudioIds(caller.actor);
	const clinics = physioClinicIds(caller.actor);
	const parts: SQL[] = [];
	if (studios.length) {
		parts.push(and(inArray(referrals.studioId, studios), isNull(referrals.studioErasedAt))!);
	}
	if (clinics.length) {
		parts.push(and(inArray(referrals.clinicId, clinics), ne(referrals.state, 'draft'))!);
	}
	return or(...parts)!;
}

export const listColumns = {
	referral: referrals,
	// After the studio erased her record the clinic still names her as it received her.
	clientName: clientNameSql,
	studioName: studioOrg.name,
	clinicName: clinicOrg.name,
	physioName: physioUser.name,
	physioEmail: physioUser.email,
	sortAt: sql<string>`to_char(${sortAt} at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`,
	rank: urgencyRank
};

export type ListRow = {
	referral: ReferralRow;
	clientName: string;
	studioName: string;
	clinicName: string;
	physioName: string | null;
	physioEmail: string | null;
	sortAt: string;
	rank: number;
};

export function toListItem(row: ListRow): ReferralListItem {
	const r = row.referral;
	return {
		id: r.id,
		state: r.state,
		clientId: r.clientId,
		clinicId: r.clinicId,
		physioId: r.physioId,
		urgency: r.urgency,
		createdAt: r.createdAt.toISOString(),
		sentAt: r.sentAt?.toISOString() ?? null,
		clientName: row.clientName,
		studioErasedAt: r.studioErasedAt?.toISOString() ?? null,
		studioId: r.studioId,
		studioName: row.studioName,
		clinicName: row.clinicName,
		physioName: row.physioName ?? row.physioEmail
	};
}

export interface ListReferralsQuery extends ReferralFilter {
	limit: number;
	cursor?: string;
	/** A page refreshing itself (header x-seamwell-background: 1), not a person asking. */
	background?: boolean;
}

/**
 * Policy: mayListReferrals (instructors: their studios'; physiotherapists: their clinics',
 * never drafts). Audit: referral.listed, one row per referral shown. A background refresh
 * logs only referrals this person has not yet been logged seeing in their current state
 * (referral_list_views), so an open inbox refreshing every few seconds does not flood the
 * log, while every new referral and every change of state she is shown is still recorded.
 */
export async function listReferrals(
	caller: Caller,
	query: ListReferralsQuery
): Promise<Page<ReferralListItem>> {
	if (!mayListReferrals(caller.actor)) {
		return refuse(
			caller,
			'referral.listed',
			new ProblemError('forbidden', {
				detail: 'Referrals are listed for instructors and physiotherapists.'
			})
		);
	}
	const after = decodeCursor(query.cursor, listCursor);
	if (after && after.s !== query.sort) {
		throw fieldProblem('/cursor', 'unknown cursor', 'The cursor belongs to another sort order.');
	}
	const where: SQL[] = [visibility(caller)];
	if (query.state.length) where.push(inArray(referrals.state, query.state));
	if (query.q) where.push(sql`${clientNameSql} ilike ${`%${escapeLike(query.q)}%`}`);
	if (after) {
		const byDate = sql`(${sortAt}, ${referrals.id}) < (${after.t}::timestamptz, ${after.id}::uuid)`;
		where.push(
			query.sort === 'urgency'
				? sql`(${urgencyRank} > ${after.r} or (${urgencyRank} = ${after.r} and ${byDate}))`
				: byDate
		);
	}
	const order =
		query.sort === 'urgency'
			? [asc(urgencyRank), desc(sortAt), desc(referrals.id)]
			: [desc(sortAt), desc(referrals.id)];

	return db().transaction(async (tx) => {
		const rows = (await tx
			.select(listColumns)
			.from(referrals)
			.leftJoin(clients, eq(clients.id, referrals.clientId))
			.leftJoin(referralSnapshots, eq(referralSnapshots.referralId, referrals.id))
			.innerJoin(studioOrg, eq(studioOrg.id, referrals.studioId))
			.innerJoin(clinicOrg, eq(clinicOrg.id, referrals.clinicId))
			.leftJoin(physioUser, eq(physioUser.id, referrals.physioId))
			.where(and(...where))
			.orderBy(...order)
			.limit(query.limit + 1)) as ListRow[];
		const page = toPage(rows, query.limit, (last) => ({
			s: query.sort,
			r: Number(last.rank),
			t: last.sortAt,
			id: last.referral.id
		}));
		await logListed(tx, caller, page.items, query.background === true);
		return { items: page.items.map(toListItem), nextCursor: page.nextCursor };
	});
}

async function logListed(
	tx: Executor,
	caller: Caller,
	items: readonly ListRow[],
	background: boolean
): Promise<void> {
	if (items.length === 0) return;
	const userId = caller.actor.userId;
	// The state each referral had when she last saw it in a list: a background refresh logs
	// only the referrals that moved since, and only those are written back. Writing every row
	// on every read made her open tabs queue behind each other's row locks.
	const seen = await tx
		.select({ referralId: referralListViews.referralId, state: referralListViews.state })
		.from(referralListViews)
		.where(
			and(
				eq(referralListViews.userId, userId),
				inArray(
					referralListViews.referralId,
					items.map((i) => i.referral.id)
				)
			)
		);
	const known = new Map(seen.map((s) => [s.referralId, s.state]));
	const moved = items.filter((i) => known.get(i.referral.id) !== i.referral.state);
	const toLog = background ? moved : items;
	if (toLog.length > 0) {
		await recordSuccesses(
			tx,
			caller.access,
			'referral.listed',
			toLog.map((item) => ({
				target: { type: 'referral', id: item.referral.id },
				clientId: item.referral.clientId
			}))
		);
	}
	if (moved.length === 0) return;
	await tx
		.insert(referralListViews)
		.values(
			moved.map((item) => ({ userId, referralId: item.referral.id, state: item.referral.state }))
		)
		.onConflictDoUpdate({
			target: [referralListViews.userId, referralListViews.referralId],
			set: { state: sql`excluded.state`, seenAt: new Date() }
		});
}

/** How far back "answered recently" reaches on the dashboards. */
export const RECENT_ANSWER_DAYS = 14;

export interface ReferralCounts {
	/** Referrals she may see, per state (a physiotherapist's never include drafts). */
	byState: Record<ReferralState, number>;
	/** Accepted or declined within RECENT_ANSWER_DAYS days (by the time of their last move). */
	acceptedRecently: number;
	declinedRecently: number;
}

/**
 * Policy: mayListReferrals (the same visibility as the list). Audit: none — numbers per state
 * name no client and show no referral; the list they link to logs referral.listed for each
 * referral shown.
 */
export async function countReferrals(caller: Caller): Promise<ReferralCounts> {
	if (!mayListReferrals(caller.actor)) {
		return refuse(
			caller,
			'referral.listed',
			new ProblemError('forbidden', {
				detail: 'Referrals are listed for instructors and physiotherapists.'
			})
		);
	}
	const since = new Date(Date.now() - RECENT_ANSWER_DAYS * 86_400_000);
	const recent = sql`${referrals.updatedAt} >= ${since}`;
	const rows = await db()
		.select({
			state: referrals.state,
			n: sql<number>`count(*)::int`,
			recent: sql<number>`(count(*) filter (where ${recent}))::int`
		})
		.from(referrals)
		.where(visibility(caller))
		.groupBy(referrals.state);
	const byState = Object.fromEntries(REFERRAL_STATES.map((s) => [s, 0])) as Record<
		ReferralState,
		number
	>;
	let acceptedRecently = 0;
	let declinedRecently = 0;
	for (const row of rows) {
		byState[row.state] = row.n;
		if (row.state === 'accepted') acceptedRecently = row.recent;
		if (row.state === 'declined') declinedRecently = row.recent;
	}
	return { byState, acceptedRecently, declinedRecently };
}
