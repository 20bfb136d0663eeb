import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { OPEN_SHARED_STATES, REFERRAL_STATE_LABELS } from '../../domain/referral';
import type { OpenReferralData } from '$lib/referrals/schemas';
import type { ClinicItem } from '$lib/referrals/types';
import { recordAccess } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import {
	clients,
	memberships,
	organisations,
	referralEvents,
	referrals,
	users
} from '../db/schema';
import { fieldProblem, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { mayListClinics, mayOpenReferral, mayReferClient } from './policy';

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
