import { and, asc, desc, eq, inArray, isNull, ne, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import { SCOPES_TO_SEND_REFERRAL } from '../../domain/consent';
import {
	OPEN_SHARED_STATES,
	REFERRAL_STATE_LABELS,
	REFERRAL_STATES,
	transitionsFrom,
	type ReferralState,
	type Transition
} from '../../domain/referral';
import type { OpenReferralData, ReferralFilter, TransitionData } from '$lib/referrals/schemas';
import type {
	ClinicItem,
	ReferralDetail,
	ReferralListItem,
	ReferralScreening
} from '$lib/referrals/types';
import { recordAccess, recordAccesses, recordRefusal, type AuditAction } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import {
	clients,
	memberships,
	organisations,
	referralEvents,
	referralListViews,
	referrals,
	referralSnapshots,
	screenings,
	users
} from '../db/schema';
import { fieldProblem, notFound, ProblemError, type ProblemSlug } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { generateReferralLetter } from './letter';
import type { NotificationKind } from '../mail/notifications';
import { clinicRecipients, instructorRecipient, notifyAll } from './notify';
import {
	decideTransition,
	instructorStudioIds,
	mayListClinics,
	mayListReferrals,
	mayOpenReferral,
	mayReadReferral,
	mayReferClient,
	physioClinicIds,
	transitionRoles
} from './policy';
import { snapshotClient, snapshotScreenings } from './snapshot';

// Referrals from a studio's instructor to a clinic. Every exported function asserts its rule
// from ./policy.ts first; work and its access-log row share one transaction; a refusal is
// logged in a transaction of its own (it survives the work's rollback) and then thrown.
// Consent is read fresh, inside the transaction of the move it allows.

type ReferralRow = typeof referrals.$inferSelect;

/** A referral the caller may see; anything else is logged as refused and answers 404. */
/**
 * The client a referral belongs to, for work that needs her record. Only a referral the
 * studio erased has none, and nobody reaches such work for it: the studio no longer sees it
 * and the clinic's sharing with her ended with the erasure. Should that ever change, the
 * answer is a refusal, not a crash.
 */
function heldClientId(row: { clientId: string | null }): string {
	if (row.clientId === null) {
		throw new ProblemError('conflict', {
			detail: "The studio erased this client's record; the referral can only be read."
		});
	}
	return row.clientId;
}

async function visibleReferral(
	caller: Caller,
	id: string,
	action: AuditAction
): Promise<ReferralRow> {
	const [row] = await db().select().from(referrals).where(eq(referrals.id, id));
	if (!row || !mayReadReferral(caller.actor, row)) {
		return refuse(caller, action, notFound(), { type: 'referral', id }, row?.clientId);
	}
	return row;
}

// ── Clinics ────────────────────────────────────────────────────────────────────────────

const clinicCursor = z.object({ n: z.string(), id: z.uuid() });

/**
 * Policy: mayListClinics (anyone signed in: clinic and physiotherapist names are no client's
 * data). Audit: none — nothing about a client is read.
 */
export async function listClinics(
	caller: Caller,
	query: { limit: number; cursor?: string }
): Promise<Page<ClinicItem>> {
	if (!mayListClinics(caller.actor)) {
		return refuse(
			caller,
			'access.denied',
			new ProblemError('forbidden', { detail: 'Not allowed.' })
		);
	}
	const after = decodeCursor(query.cursor, clinicCursor);
	const where: SQL[] = [eq(organisations.kind, 'clinic')];
	if (after)
		where.push(sql`(${organisations.name}, ${organisations.id}) > (${after.n}, ${after.id}::uuid)`);
	const rows = await db()
		.select({ id: organisations.id, name: organisations.name })
		.from(organisations)
		.where(and(...where))
		.orderBy(asc(organisations.name), asc(organisations.id))
		.limit(query.limit + 1);
	const page = toPage(rows, query.limit, (last) => ({ n: last.name, id: last.id }));
	const ids = page.items.map((c) => c.id);
	const physios = ids.length
		? await db()
				.select({
					clinicId: memberships.organisationId,
					id: users.id,
					name: users.name,
					email: users.email
				})
				.from(memberships)
				.innerJoin(users, eq(users.id, memberships.userId))
				.where(
					and(
						inArray(memberships.organisationId, ids),
						eq(memberships.role, 'physiotherapist'),
						eq(memberships.active, true),
						eq(users.active, true)
					)
				)
				.orderBy(asc(users.name))
		: [];
	return {
		items: page.items.map((clinic) => ({
			...clinic,
			physiotherapists: physios
				.filter((p) => p.clinicId === clinic.id)
				.map((p) => ({ id: p.id, name: p.name ?? p.email }))
		})),
		nextCursor: page.nextCursor
	};
}

// ── Opening a draft ────────────────────────────────────────────────────────────────────

/**
 * Policy: mayOpenReferral, then mayReferClient (an instructor of the client's studio).
 * Audit: referral.created. A draft needs no consent and the clinic never sees it.
 */
export async function openReferral(
	caller: Caller,
	input: OpenReferralData
): Promise<{ id: string; state: 'draft' }> {
	const { actor } = caller;
	if (!mayOpenReferral(actor)) {
		return refuse(
			caller,
			'referral.created',
			new ProblemError('forbidden', { detail: 'Referrals are opened by instructors of a studio.' })
		);
	}
	const [client] = await db()
		.select({ id: clients.id, organisationId: clients.organisationId })
		.from(clients)
		.where(eq(clients.id, input.clientId));
	if (!client || !mayReferClient(actor, client)) {
		return refuse(
			caller,
			'referral.created',
			fieldProblem('/clientId', 'unknown client', 'There is no such client in your studio.'),
			{ type: 'client', id: input.clientId },
			client?.id
		);
	}
	return db().transaction(async (tx) => {
		const [clinic] = await tx
			.select({ id: organisations.id })
			.from(organisations)
			.where(and(eq(organisations.id, input.clinicId), eq(organisations.kind, 'clinic')));
		if (!clinic) throw fieldProblem('/clinicId', 'unknown clinic', 'There is no such clinic.');
		if (input.physioId) {
			const [physio] = await tx
				.select({ id: memberships.userId })
				.from(memberships)
				.innerJoin(users, eq(users.id, memberships.userId))
				.where(
					and(
						eq(memberships.userId, input.physioId),
						eq(memberships.organisationId, clinic.id),
						eq(memberships.role, 'physiotherapist'),
						eq(memberships.active, true),
						eq(users.active, true)
					)
				);
			if (!physio) {
				throw fieldProblem(
					'/physioId',
					'not a physiotherapist of this clinic',
					'The physiotherapist named does not work at this clinic.'
				);
			}
		}
		// A second referral to a clinic that is already acting on one is most often a slip:
		// point to the open one, and allow a second only with a reason, kept in its history.
		const [open] = await tx
			.select({ id: referrals.id, state: referrals.state })
			.from(referrals)
			.where(
				and(
					eq(referrals.clientId, client.id),
					eq(referrals.clinicId, clinic.id),
					inArray(referrals.state, [...OPEN_SHARED_STATES])
				)
			)
			.orderBy(desc(referrals.createdAt))
			.limit(1);
		if (open && !input.duplicateReason) {
			throw new ProblemError('duplicate-referral', {
				detail: `She already has a referral to this clinic that is ${REFERRAL_STATE_LABELS[open.state].toLowerCase()}. Open that one, or say why a second one is needed.`,
				openReferralId: open.id,
				errors: [
					{
						pointer: '/duplicateReason',
						message:
							'she already has an open referral to this clinic: say why a second one is needed'
					}
				]
			});
		}
		const [row] = await tx
			.insert(referrals)
			.values({
				clientId: client.id,
				studioId: client.organisationId,
				clinicId: clinic.id,
				physioId: input.physioId ?? null,
				createdBy: actor.userId,
				reason: input.reason,
				urgency: input.urgency,
				redFlags: input.redFlags,
				state: 'draft'
			})
			.returning({ id: referrals.id });
		const id = row!.id;
		await tx.insert(referralEvents).values({
			referralId: id,
			fromState: null,
			toState: 'draft',
			actorUserId: actor.userId,
			actorRole: 'instructor',
			reason: open ? `Second referral while one is open: ${input.duplicateReason}` : null
		});
		await recordAccess(tx, caller.access, {
			action: 'referral.created',
			outcome: 'success',
			target: { type: 'referral', id },
			clientId: client.id
		});
		return { id, state: 'draft' as const };
	});
}

// ── Lists ──────────────────────────────────────────────────────────────────────────────

const listCursor = z.object({
	s: z.enum(['date', 'urgency']),
	r: z.number().int().min(0).max(1),
	t: z.iso.datetime(),
	id: z.uuid()
});

const studioOrg = alias(organisations, 'studio_org');
const clinicOrg = alias(organisations, 'clinic_org');
const physioUser = alias(users, 'physio_user');
const creatorUser = alias(users, 'creator_user');

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

const listColumns = {
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

type ListRow = {
	referral: ReferralRow;
	clientName: string;
	studioName: string;
	clinicName: string;
	physioName: string | null;
	physioEmail: string | null;
	sortAt: string;
	rank: number;
};

function toListItem(row: ListRow): ReferralListItem {
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
	let toLog = items;
	if (background) {
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
		toLog = items.filter((i) => known.get(i.referral.id) !== i.referral.state);
	}
	if (toLog.length === 0) return;
	await recordAccesses(
		tx,
		caller.access,
		toLog.map((item) => ({
			action: 'referral.listed' as const,
			outcome: 'success' as const,
			target: { type: 'referral', id: item.referral.id },
			clientId: item.referral.clientId
		}))
	);
	await tx
		.insert(referralListViews)
		.values(
			toLog.map((item) => ({ userId, referralId: item.referral.id, state: item.referral.state }))
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

// ── One referral ───────────────────────────────────────────────────────────────────────

/**
 * Policy: mayReadReferral (the studio's instructors; the clinic's physiotherapists once it is
 * sent). Audit: referral.read. The clinic reads the copy it received when the referral was
 * sent, also after sharing ended (labelled with the date it ended).
 */
export async function getReferral(caller: Caller, id: string): Promise<ReferralDetail> {
	const row = await visibleReferral(caller, id, 'referral.read');
	const { actor } = caller;
	const viewer = instructorStudioIds(actor).includes(row.studioId) ? 'studio' : 'clinic';
	return db().transaction(async (tx) => {
		const [listRow] = (await tx
			.select({ ...listColumns, creatorName: creatorUser.name })
			.from(referrals)
			.leftJoin(clients, eq(clients.id, referrals.clientId))
			.leftJoin(referralSnapshots, eq(referralSnapshots.referralId, referrals.id))
			.innerJoin(studioOrg, eq(studioOrg.id, referrals.studioId))
			.innerJoin(clinicOrg, eq(clinicOrg.id, referrals.clinicId))
			.leftJoin(physioUser, eq(physioUser.id, referrals.physioId))
			.leftJoin(creatorUser, eq(creatorUser.id, referrals.createdBy))
			.where(eq(referrals.id, id))) as Array<ListRow & { creatorName: string | null }>;
		if (!listRow) throw notFound();
		const current = listRow.referral;
		const actorUser = alias(users, 'actor_user');
		const events = await tx
			.select({
				from: referralEvents.fromState,
				to: referralEvents.toState,
				at: referralEvents.at,
				byName: actorUser.name,
				byRole: referralEvents.actorRole,
				reason: referralEvents.reason
			})
			.from(referralEvents)
			.leftJoin(actorUser, eq(actorUser.id, referralEvents.actorUserId))
			.where(eq(referralEvents.referralId, id))
			.orderBy(asc(referralEvents.id));
		const [snapshot] = await tx
			.select()
			.from(referralSnapshots)
			.where(eq(referralSnapshots.referralId, id));

		let client: ReferralDetail['client'];
		let shown: ReferralScreening[];
		if (snapshot) {
			client = snapshot.client;
			shown = snapshot.screenings;
		} else {
			// A draft: only its own studio sees it, and the preview is the record as it stands.
			const clientId = heldClientId(current);
			const [record] = await tx.select().from(clients).where(eq(clients.id, clientId));
			const history = await tx
				.select()
				.from(screenings)
				.where(eq(screenings.clientId, clientId))
				.orderBy(asc(screenings.takenAt));
			client = snapshotClient(record!);
			shown = snapshotScreenings(history);
		}
		const pair = {
			clientId: current.clientId,
			studioId: current.studioId,
			clinicId: current.clinicId
		};
		const sending = await sharingState(tx, pair, SCOPES_TO_SEND_REFERRAL);
		const live = await sharingState(tx, pair, ['screenings']);
		const roles = transitionRoles(actor, current);
		await recordAccess(tx, caller.access, {
			action: 'referral.read',
			outcome: 'success',
			target: { type: 'referral', id },
			clientId: current.clientId
		});
		return {
			...toListItem(listRow),
			reason: current.reason,
			redFlags: current.redFlags,
			createdById: current.createdBy,
			createdByName: listRow.creatorName,
			viewer,
			client,
			history: events.map((e) => ({ ...e, at: e.at.toISOString() })),
			screenings: shown,
			snapshotTakenAt: snapshot?.takenAt.toISOString() ?? null,
			sharing: {
				status: sending.status,
				endedAt: sending.endedAt?.toISOString() ?? null,
				canSend: sending.covered,
				screeningsLive: live.covered
			},
			actions: transitionsFrom(current.state, roles).map((t) => ({
				to: t.to,
				reasonRequired: t.reasonRequired
			}))
		};
	});
}

const liveCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/**
 * Policy: mayReadReferral, and for the clinic a grant in force with `screenings` (read fresh;
 * without it the read is refused and logged). Audit: screening.read. Her live screening
 * history, oldest first — including screenings recorded after the referral was sent.
 */
export async function listLiveScreenings(
	caller: Caller,
	referralId: string,
	query: { limit: number; cursor?: string }
): Promise<Page<ReferralScreening>> {
	const row = await visibleReferral(caller, referralId, 'screening.read');
	const studioSide = instructorStudioIds(caller.actor).includes(row.studioId);
	const after = decodeCursor(query.cursor, liveCursor);
	if (!studioSide) {
		const state = await sharingState(db(), row, ['screenings']);
		if (!state.covered) {
			const ended = state.endedAt
				? ` Sharing ended on ${state.endedAt.toISOString().slice(0, 10)}.`
				: '';
			return refuse(
				caller,
				'screening.read',
				new ProblemError('forbidden', {
					detail: `The client has not consented to share her screening history with your clinic.${ended} The copy sent with the referral stays readable.`
				}),
				{ type: 'referral', id: referralId },
				row.clientId
			);
		}
	}
	return db().transaction(async (tx) => {
		const where: SQL[] = [eq(screenings.clientId, heldClientId(row))];
		if (after) {
			where.push(
				sql`(${screenings.takenAt}, ${screenings.id}) > (${after.t}::timestamptz, ${after.id}::uuid)`
			);
		}
		const rows = await tx
			.select()
			.from(screenings)
			.where(and(...where))
			.orderBy(asc(screenings.takenAt), asc(screenings.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			t: last.takenAt.toISOString(),
			id: last.id
		}));
		await recordAccess(tx, caller.access, {
			action: 'screening.read',
			outcome: 'success',
			target: { type: 'referral', id: referralId },
			clientId: row.clientId
		});
		return { items: snapshotScreenings(page.items), nextCursor: page.nextCursor };
	});
}

// ── Moving a referral ──────────────────────────────────────────────────────────────────

const ROLE_WORDS: Record<Transition['by'], string> = {
	studio_instructor: 'instructor',
	clinic_physio: 'physiotherapist',
	assigned_physio: 'physiotherapist'
};

const MAIL_KIND: Partial<Record<ReferralState, NotificationKind>> = {
	sent: 'referral.received',
	accepted: 'referral.accepted',
	declined: 'referral.declined',
	assessed: 'referral.assessed',
	closed: 'referral.closed',
	withdrawn: 'referral.withdrawn'
};

/** Problems a move can end in that are the caller's attempt refused (logged as such). */
const REFUSALS = new Set<ProblemSlug>(['forbidden', 'invalid-transition', 'consent-required']);

/**
 * Policy: mayReadReferral (else 404), then decideTransition — the table in
 * src/lib/domain/referral.ts (role → 403, state → 409) — and consent in force where the move
 * needs it (409 consent-required). Audit: referral.transitioned. The update applies only
 * where the state is still the one read; a move lost to a concurrent change answers 409.
 */
export async function transitionReferral(
	caller: Caller,
	id: string,
	input: TransitionData
): Promise<{ id: string; state: ReferralState }> {
	const row = await visibleReferral(caller, id, 'referral.transitioned');
	const to = input.to as ReferralState;
	const target = { type: 'referral', id };
	const from = row.state;
	const decision = decideTransition(caller.actor, row, to);
	if (decision.kind === 'forbidden') {
		return refuse(
			caller,
			'referral.transitioned',
			new ProblemError('forbidden', {
				detail: `Your role here may not mark this referral ${REFERRAL_STATE_LABELS[to].toLowerCase()}.`
			}),
			target,
			row.clientId
		);
	}
	if (decision.kind === 'invalid') {
		return refuse(
			caller,
			'referral.transitioned',
			invalidTransition(from, to),
			target,
			row.clientId
		);
	}
	const transition = decision.transition;
	if (transition.reasonRequired && !input.reason) {
		throw fieldProblem('/reason', 'required', 'Give a reason for this step.');
	}
	try {
		return await db().transaction((tx) =>
			applyTransition(tx, caller, row, transition, input.reason)
		);
	} catch (error) {
		if (error instanceof ProblemError && REFUSALS.has(error.slug)) {
			await recordRefusal(caller.access, {
				action: 'referral.transitioned',
				target,
				clientId: row.clientId
			});
		}
		throw error;
	}
}

function invalidTransition(from: ReferralState, to: ReferralState, raced = false): ProblemError {
	return new ProblemError('invalid-transition', {
		detail: raced
			? `The referral changed while you were acting on it: it is no longer ${REFERRAL_STATE_LABELS[from].toLowerCase()}. Reload it and try again.`
			: `A referral that is ${REFERRAL_STATE_LABELS[from].toLowerCase()} cannot become ${REFERRAL_STATE_LABELS[to].toLowerCase()}.`,
		state: from
	});
}

/**
 * Applies an allowed move inside the caller's transaction: consent read fresh and held, the
 * state guarded, the event, the access-log row and the hand-off mail. Not caller-facing: the
 * calling service has decided the move with decideTransition (the assessment service moves
 * accepted → assessed with the findings it records).
 */
export async function applyTransition(
	tx: Executor,
	caller: Caller,
	row: ReferralRow,
	transition: Transition,
	reason: string | null
): Promise<{ id: string; state: ReferralState }> {
	const { actor } = caller;
	const now = new Date();
	const pair = { clientId: row.clientId, studioId: row.studioId, clinicId: row.clinicId };
	let consentId: string | null = null;
	if (transition.consent.length > 0) {
		// Read fresh and hold the grant against a concurrent withdrawal until this commits.
		const state = await sharingState(tx, pair, transition.consent, now, { lock: true });
		if (!state.covered) throw consentRequired(row, transition);
		consentId = state.grant!.id;
	}
	const changes: Partial<typeof referrals.$inferInsert> = { state: transition.to, updatedAt: now };
	if (transition.to === 'sent') Object.assign(changes, { sentAt: now, consentId });
	if (transition.to === 'accepted' && row.physioId === null) changes.physioId = actor.userId;
	const [updated] = await tx
		.update(referrals)
		.set(changes)
		.where(and(eq(referrals.id, row.id), eq(referrals.state, transition.from)))
		.returning({ id: referrals.id, state: referrals.state, physioId: referrals.physioId });
	if (!updated) throw invalidTransition(transition.from, transition.to, true);

	await tx.insert(referralEvents).values({
		referralId: row.id,
		fromState: transition.from,
		toState: transition.to,
		at: now,
		actorUserId: actor.userId,
		actorRole: ROLE_WORDS[transition.by],
		reason
	});
	if (transition.to === 'sent') {
		await takeSnapshot(tx, row, now);
		// The letter goes with the referral: a send that cannot store it does not happen.
		await generateReferralLetter(tx, row.id);
	}
	await recordAccess(tx, caller.access, {
		action: 'referral.transitioned',
		outcome: 'success',
		target: { type: 'referral', id: row.id },
		clientId: row.clientId
	});
	await notifyTransition(tx, row, transition, updated.physioId);
	return { id: updated.id, state: updated.state };
}

function consentRequired(row: ReferralRow, transition: Transition): ProblemError {
	if (transition.from === 'draft') {
		return new ProblemError('consent-required', {
			detail:
				'The client has not consented to share her referral and screening history with this clinic. You can ask her: she gets an e-mail with a link to her consent page.',
			requestConsent: {
				href: '/api/v1/consent-requests',
				method: 'POST',
				body: { clientId: row.clientId, clinicId: row.clinicId }
			}
		});
	}
	return new ProblemError('consent-required', {
		detail:
			"The client's consent to share with your clinic is not in force, so this referral cannot be acted on."
	});
}

/** The copy the clinic receives: her details and screening history as they are now. */
async function takeSnapshot(tx: Executor, row: ReferralRow, now: Date): Promise<void> {
	const clientId = heldClientId(row);
	const [record] = await tx.select().from(clients).where(eq(clients.id, clientId));
	const history = await tx
		.select()
		.from(screenings)
		.where(eq(screenings.clientId, clientId))
		.orderBy(asc(screenings.takenAt));
	await tx.insert(referralSnapshots).values({
		referralId: row.id,
		takenAt: now,
		client: snapshotClient(record!),
		screenings: snapshotScreenings(history)
	});
}

/** Each hand-off tells the other side there is something to see. */
async function notifyTransition(
	tx: Executor,
	row: ReferralRow,
	transition: Transition,
	physioId: string | null
): Promise<void> {
	const kind = MAIL_KIND[transition.to];
	if (!kind) return;
	const toClinic = transition.to === 'sent' || transition.to === 'withdrawn';
	// A withdrawn draft was never the clinic's business: it never saw it.
	if (transition.to === 'withdrawn' && transition.from === 'draft') return;
	const recipients = toClinic
		? await clinicRecipients(tx, row.clinicId, physioId)
		: await instructorRecipient(tx, row.createdBy);
	await notifyAll(tx, recipients, kind, row.id);
}
