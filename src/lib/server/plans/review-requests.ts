import { and, desc, eq, inArray, isNull, sql } from 'drizzle-orm';
import { SHIPPED_EXERCISES } from '$lib/domain/exercises/exercise';
import { recordAccess, recordSuccesses } from '../audit';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clearanceReviewRequests,
	clearances,
	clients,
	memberships,
	organisations,
	users
} from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { mayUseStudioRecord } from './policy';
import { refuseUse } from './shared';
import { libraryFor } from './library';

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
		await recordSuccesses(
			tx,
			caller.access,
			'clearance.listed',
			rows.map((r) => ({
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
