import { and, asc, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { consentStatus, sharingEndedAt, type ShareScope } from '../../domain/consent';
import { OPEN_SHARED_STATES, type ReferralState } from '../../domain/referral';
import { recordAccess, recordSuccesses } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	consentEvents,
	consentRequests,
	consents,
	organisations,
	referrals,
	users
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayGiveConsent, mayListConsents } from './policy';
import { adminOrganisationIds } from '../scope';
import { type ConsentItem, listCursor, toItem } from './shared';

export async function listConsents(
	caller: Caller,
	query: { limit: number; cursor?: string }
): Promise<Page<ConsentItem>> {
	const { actor } = caller;
	if (!mayListConsents(actor)) {
		return refuse(
			caller,
			'consent.read',
			new ProblemError('forbidden', {
				detail:
					'Consents are read by the client who gave them and by the admins of the organisations they name.'
			})
		);
	}
	const after = decodeCursor(query.cursor, listCursor);
	const admin = adminOrganisationIds(actor);
	const visible: SQL[] = [];
	if (actor.clientId) visible.push(eq(consents.clientId, actor.clientId));
	if (admin.length > 0) {
		visible.push(inArray(consents.studioId, admin), inArray(consents.clinicId, admin));
	}
	const where: SQL[] = [or(...visible)!];
	if (after) {
		where.push(
			sql`(${consents.startsAt}, ${consents.id}) < (${after.t}::timestamptz, ${after.id}::uuid)`
		);
	}
	const now = new Date();
	return db().transaction(async (tx) => {
		const rows = await tx
			.select()
			.from(consents)
			.where(and(...where))
			.orderBy(desc(consents.startsAt), desc(consents.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			t: last.startsAt.toISOString(),
			id: last.id
		}));
		await recordSuccesses(
			tx,
			caller.access,
			'consent.read',
			page.items.map((row) => ({
				target: { type: 'consent', id: row.id },
				clientId: row.clientId
			}))
		);
		return { items: page.items.map((row) => toItem(row, now)), nextCursor: page.nextCursor };
	});
}

export interface ConsentHistoryEntry {
	kind: 'given' | 'withdrawn';
	at: string;
	byName: string | null;
}

export interface ConsentGrantView extends ConsentItem {
	clinicName: string;
	/** When sharing under this grant stopped (withdrawn or ended), or null while it holds. */
	endedAt: string | null;
	history: ConsentHistoryEntry[];
	/** Her referrals the clinic still acts on: withdrawing this grant ends them. */
	openReferrals: Array<{ id: string; state: ReferralState; physioName: string | null }>;
}

export interface ConsentRequestView {
	id: string;
	clinicId: string;
	clinicName: string;
	requestedByName: string | null;
	createdAt: string;
	answeredAt: string | null;
}

export interface ConsentOverview {
	studioName: string;
	grants: ConsentGrantView[];
	requests: ConsentRequestView[];
	clinics: Array<{ id: string; name: string }>;
}

/** Policy: mayGiveConsent (the client herself). Audit: consent.read, one row for her page. */
export async function getConsentOverview(caller: Caller): Promise<ConsentOverview> {
	const { actor } = caller;
	if (!mayGiveConsent(actor)) {
		return refuse(
			caller,
			'consent.read',
			new ProblemError('forbidden', {
				detail: 'This page is for clients: it lists the consents you have given.'
			})
		);
	}
	const clientId = actor.clientId;
	const now = new Date();
	return db().transaction(async (tx) => {
		const [client] = await tx
			.select({ studioName: organisations.name })
			.from(clients)
			.innerJoin(organisations, eq(organisations.id, clients.organisationId))
			.where(eq(clients.id, clientId));
		if (!client) throw notFound();
		const grantRows = await tx
			.select({ consent: consents, clinicName: organisations.name })
			.from(consents)
			.innerJoin(organisations, eq(organisations.id, consents.clinicId))
			.where(eq(consents.clientId, clientId))
			.orderBy(desc(consents.startsAt));
		const ids = grantRows.map((g) => g.consent.id);
		const events = ids.length
			? await tx
					.select({
						consentId: consentEvents.consentId,
						kind: consentEvents.kind,
						at: consentEvents.at,
						byName: users.name
					})
					.from(consentEvents)
					.leftJoin(users, eq(users.id, consentEvents.actorUserId))
					.where(inArray(consentEvents.consentId, ids))
					.orderBy(asc(consentEvents.at), asc(consentEvents.id))
			: [];
		const requester = alias(users, 'requester');
		const requestRows = await tx
			.select({
				id: consentRequests.id,
				clinicId: consentRequests.clinicId,
				clinicName: organisations.name,
				requestedByName: requester.name,
				createdAt: consentRequests.createdAt,
				answeredAt: consentRequests.answeredAt
			})
			.from(consentRequests)
			.innerJoin(organisations, eq(organisations.id, consentRequests.clinicId))
			.leftJoin(requester, eq(requester.id, consentRequests.requestedBy))
			.where(eq(consentRequests.clientId, clientId))
			.orderBy(desc(consentRequests.createdAt));
		const clinicRows = await tx
			.select({ id: organisations.id, name: organisations.name })
			.from(organisations)
			.where(eq(organisations.kind, 'clinic'))
			.orderBy(asc(organisations.name));
		const physio = alias(users, 'physio');
		const openReferralRows = await tx
			.select({
				id: referrals.id,
				state: referrals.state,
				clinicId: referrals.clinicId,
				studioId: referrals.studioId,
				physioName: physio.name
			})
			.from(referrals)
			.leftJoin(physio, eq(physio.id, referrals.physioId))
			.where(
				and(eq(referrals.clientId, clientId), inArray(referrals.state, [...OPEN_SHARED_STATES]))
			)
			.orderBy(desc(referrals.createdAt));
		await recordAccess(tx, caller.access, {
			action: 'consent.read',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		return {
			studioName: client.studioName,
			grants: grantRows.map(({ consent, clinicName }) => ({
				...toItem(consent, now),
				clinicName,
				endedAt: sharingEndedAt(consent, now)?.toISOString() ?? null,
				history: events
					.filter((e) => e.consentId === consent.id)
					.map((e) => ({ kind: e.kind, at: e.at.toISOString(), byName: e.byName })),
				openReferrals: openReferralRows
					.filter((r) => r.clinicId === consent.clinicId && r.studioId === consent.studioId)
					.map(({ id, state, physioName }) => ({ id, state, physioName }))
			})),
			requests: requestRows.map((r) => ({
				...r,
				createdAt: r.createdAt.toISOString(),
				answeredAt: r.answeredAt?.toISOString() ?? null
			})),
			clinics: clinicRows
		};
	});
}

export interface SharingCounts {
	/** Her grants in force now. */
	activeGrants: number;
	/** Requests to share with a clinic she has not answered and does not share with yet. */
	openRequests: number;
}

/**
 * Policy: mayGiveConsent (the client herself). Audit: none — two numbers about her own
 * grants, shown only to her; her consent page, which they link to, logs consent.read.
 */
export async function countOwnSharing(caller: Caller): Promise<SharingCounts> {
	const { actor } = caller;
	if (!mayGiveConsent(actor)) {
		return refuse(
			caller,
			'consent.read',
			new ProblemError('forbidden', { detail: 'Only a client has consents of her own.' })
		);
	}
	const now = new Date();
	const [grants, requests] = await Promise.all([
		db()
			.select()
			.from(consents)
			.where(and(eq(consents.clientId, actor.clientId), isNull(consents.withdrawnAt))),
		db()
			.select({ clinicId: consentRequests.clinicId })
			.from(consentRequests)
			.where(and(eq(consentRequests.clientId, actor.clientId), isNull(consentRequests.answeredAt)))
	]);
	// The same rule as her consent page: status from the domain, a request open until she
	// shares with that clinic.
	const active = grants.filter((g) => consentStatus(g, now) === 'active');
	const sharing = new Set(active.map((g) => g.clinicId));
	return {
		activeGrants: active.length,
		openRequests: requests.filter((r) => !sharing.has(r.clinicId)).length
	};
}

export interface GiveConsentInput {
	clinicId: string;
	scopes: ShareScope[];
	endsAt?: Date | null;
}

/**
 * Policy: mayGiveConsent (the client herself, for her own record). Audit: consent.given.
 * One grant in force per clinic at a time: to change scopes she withdraws and gives again.
 */
