import { and, asc, desc, eq, inArray, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { z } from 'zod';
import {
	consentStatus,
	normaliseScopes,
	sharingEndedAt,
	type ConsentStatus,
	type ShareScope
} from '../../domain/consent';
import { OPEN_SHARED_STATES, type ReferralState } from '../../domain/referral';
import { recordAccess, recordAccesses } from '../audit';
import { config } from '../config';
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
import { fieldProblem, notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { queueNotification } from '../mail/outbox';
import { instructorRecipient } from '../referrals/notify';
import { markClearancesSharingEnded } from '../clearance/sharing-ended';
import { withdrawOpenReferrals } from '../referrals/sharing-ended';
import {
	mayGiveConsent,
	mayListConsents,
	mayRequestAnyConsent,
	mayRequestConsent,
	mayWithdrawConsent
} from './policy';
import { adminOrganisationIds } from '../scope';

// Consent to share between a client's studio and one clinic. The client gives and withdraws
// her own grants; her studio's instructors may ask her to; admins read their organisation's.
// Every exported function asserts its rule first; work and its access-log row share one
// transaction; a refusal is logged in its own transaction and then thrown.

export interface ConsentItem {
	id: string;
	clientId: string;
	studioId: string;
	clinicId: string;
	scopes: ShareScope[];
	startsAt: string;
	endsAt: string | null;
	withdrawnAt: string | null;
	status: ConsentStatus;
}

type ConsentRow = typeof consents.$inferSelect;

function toItem(row: ConsentRow, now: Date): ConsentItem {
	return {
		id: row.id,
		clientId: row.clientId,
		studioId: row.studioId,
		clinicId: row.clinicId,
		scopes: normaliseScopes(row.scopes),
		startsAt: row.startsAt.toISOString(),
		endsAt: row.endsAt?.toISOString() ?? null,
		withdrawnAt: row.withdrawnAt?.toISOString() ?? null,
		status: consentStatus(row, now)
	};
}

const listCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/**
 * Policy: mayListConsents (the client's own grants; an admin's organisation's). Audit:
 * consent.read, one row per grant shown.
 */
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
		await recordAccesses(
			tx,
			caller.access,
			page.items.map((row) => ({
				action: 'consent.read' as const,
				outcome: 'success' as const,
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
export async function giveConsent(
	caller: Caller,
	input: GiveConsentInput
): Promise<{ id: string }> {
	const { actor } = caller;
	if (!mayGiveConsent(actor)) {
		return refuse(
			caller,
			'consent.given',
			new ProblemError('forbidden', { detail: 'Only a client gives consent, for her own record.' })
		);
	}
	const clientId = actor.clientId;
	const now = new Date();
	if (input.endsAt && input.endsAt.getTime() <= now.getTime()) {
		throw fieldProblem('/endsAt', 'must be in the future', 'The end of a consent must lie ahead.');
	}
	return db().transaction(async (tx) => {
		// Serialise gives for one client, so two clicks cannot leave two grants in force.
		const [client] = await tx
			.select({ id: clients.id, organisationId: clients.organisationId })
			.from(clients)
			.where(eq(clients.id, clientId))
			.for('update');
		if (!client) throw notFound();
		const [clinic] = await tx
			.select({ id: organisations.id })
			.from(organisations)
			.where(and(eq(organisations.id, input.clinicId), eq(organisations.kind, 'clinic')));
		if (!clinic) throw fieldProblem('/clinicId', 'unknown clinic', 'There is no such clinic.');
		const existing = await tx
			.select()
			.from(consents)
			.where(
				and(
					eq(consents.clientId, clientId),
					eq(consents.clinicId, input.clinicId),
					isNull(consents.withdrawnAt)
				)
			);
		if (existing.some((g) => consentStatus(g, now) === 'active')) {
			throw new ProblemError('conflict', {
				detail:
					'You already share with this clinic. To change what is shared, withdraw that consent and give a new one.'
			});
		}
		const [row] = await tx
			.insert(consents)
			.values({
				clientId,
				studioId: client.organisationId,
				clinicId: input.clinicId,
				scopes: normaliseScopes(input.scopes),
				startsAt: now,
				endsAt: input.endsAt ?? null,
				givenBy: actor.userId
			})
			.returning({ id: consents.id });
		const id = row!.id;
		await tx
			.insert(consentEvents)
			.values({ consentId: id, kind: 'given', at: now, actorUserId: actor.userId });
		const answered = await tx
			.update(consentRequests)
			.set({ answeredAt: now, consentId: id })
			.where(
				and(
					eq(consentRequests.clientId, clientId),
					eq(consentRequests.clinicId, input.clinicId),
					isNull(consentRequests.answeredAt)
				)
			)
			.returning({ requestedBy: consentRequests.requestedBy });
		// The instructors who asked hear that they can now send the referral (no name, no detail).
		const askedBy = [...new Set(answered.map((r) => r.requestedBy).filter((u) => u !== null))];
		for (const userId of askedBy) {
			for (const to of await instructorRecipient(tx, userId)) {
				await queueNotification(tx, {
					to,
					kind: 'consent.given',
					link: `${config().ORIGIN}/clients/${clientId}`
				});
			}
		}
		await recordAccess(tx, caller.access, {
			action: 'consent.given',
			outcome: 'success',
			target: { type: 'consent', id },
			clientId
		});
		return { id };
	});
}

/**
 * Policy: mayWithdrawConsent (the client herself). Audit: consent.withdrawn, and
 * referral.transitioned for each open referral it withdraws. Sharing stops at once: the
 * clinic's open referrals for her move to withdrawn ("consent withdrawn"), in this transaction.
 */
export async function withdrawConsent(
	caller: Caller,
	id: string
): Promise<{ id: string; withdrawnAt: string; referralsWithdrawn: number }> {
	const [grant] = await db().select().from(consents).where(eq(consents.id, id));
	if (!grant || !mayWithdrawConsent(caller.actor, grant)) {
		return refuse(
			caller,
			'consent.withdrawn',
			notFound(),
			{ type: 'consent', id },
			grant?.clientId
		);
	}
	const now = new Date();
	return db().transaction(async (tx) => {
		const [updated] = await tx
			.update(consents)
			.set({ withdrawnAt: now, withdrawnBy: caller.actor.userId })
			.where(and(eq(consents.id, id), isNull(consents.withdrawnAt)))
			.returning();
		if (!updated) {
			throw new ProblemError('conflict', { detail: 'This consent has already been withdrawn.' });
		}
		await tx
			.insert(consentEvents)
			.values({ consentId: id, kind: 'withdrawn', at: now, actorUserId: caller.actor.userId });
		await recordAccess(tx, caller.access, {
			action: 'consent.withdrawn',
			outcome: 'success',
			target: { type: 'consent', id },
			clientId: grant.clientId
		});
		const pair = { clientId: grant.clientId, studioId: grant.studioId, clinicId: grant.clinicId };
		const withdrawn = await withdrawOpenReferrals(tx, caller, pair);
		await markClearancesSharingEnded(tx, pair, now);
		return { id, withdrawnAt: now.toISOString(), referralsWithdrawn: withdrawn };
	});
}

/**
 * Policy: mayRequestConsent (an instructor of the client's studio). Audit: consent.requested.
 * Mails the client a link to her consent page — no health details, no clinic's findings.
 */
export async function requestConsent(
	caller: Caller,
	input: { clientId: string; clinicId: string }
): Promise<{ id: string }> {
	const { actor } = caller;
	if (!mayRequestAnyConsent(actor)) {
		return refuse(
			caller,
			'consent.requested',
			new ProblemError('forbidden', { detail: 'Instructors ask their clients for consent.' })
		);
	}
	const [client] = await db()
		.select({ id: clients.id, organisationId: clients.organisationId, email: clients.email })
		.from(clients)
		.where(eq(clients.id, input.clientId));
	if (!client || !mayRequestConsent(actor, client)) {
		return refuse(
			caller,
			'consent.requested',
			fieldProblem('/clientId', 'unknown client', 'There is no such client in your studio.'),
			{ type: 'client', id: input.clientId },
			client?.id
		);
	}
	if (!client.email) {
		throw fieldProblem(
			'/clientId',
			'has no e-mail address on record',
			'Add her e-mail address to her record first: the request goes to her by e-mail.'
		);
	}
	const address = client.email;
	return db().transaction(async (tx) => {
		const [clinic] = await tx
			.select({ id: organisations.id })
			.from(organisations)
			.where(and(eq(organisations.id, input.clinicId), eq(organisations.kind, 'clinic')));
		if (!clinic) throw fieldProblem('/clinicId', 'unknown clinic', 'There is no such clinic.');
		const [row] = await tx
			.insert(consentRequests)
			.values({ clientId: client.id, clinicId: clinic.id, requestedBy: actor.userId })
			.returning({ id: consentRequests.id });
		const id = row!.id;
		await queueNotification(tx, {
			to: address,
			kind: 'consent.requested',
			link: `${config().ORIGIN}/consents?request=${id}`
		});
		await recordAccess(tx, caller.access, {
			action: 'consent.requested',
			outcome: 'success',
			target: { type: 'consent_request', id },
			clientId: client.id
		});
		return { id };
	});
}
