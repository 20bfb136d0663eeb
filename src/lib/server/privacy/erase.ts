import { and, eq, inArray, isNotNull, isNull, sql } from 'drizzle-orm';
import type { AccessContext } from '../audit';
import { forgetSubjectKey, recordAccess } from '../audit';
import { config } from '../config';
import type { Transaction } from '../db';
import {
	assessments,
	clearances,
	clients,
	invitations,
	memberships,
	outbox,
	planOverrides,
	plans,
	rateLimitHits,
	referralListViews,
	referrals,
	subjectKeys,
	users,
	verificationTokens
} from '../db/schema';
import { queueNotification } from '../mail/outbox';
import { clinicRecipients, notifyAll } from '../referrals/notify';

// The erasure itself, in the caller's transaction (privacy/erasure.ts asserts the admin's
// policy first). What happens to each table is written down in erasure-rules.ts; this is the
// one place that does it. The order matters in two places:
// - the access-log row for the erasure is written while her subject key still exists, so the
//   row names the key, and then the key's row is deleted: the log keeps every row and its
//   chain, but nothing leads from it to her any more;
// - referrals the clinic received are unlinked before her record is deleted (the database
//   refuses to leave a referral pointing nowhere without the erasure stamp).
//
// Files: every stored object belongs to the clinic's record (assessment documents, and the
// referral letter it received), so none is deleted here. An object whose row is ever deleted
// is removed by the documents sweeper, which retries until the store answers.

/** Counts of what went, per kind: the studio's receipt (no values, no names). */
export type ErasedCounts = Record<string, number>;

export interface ErasureResult {
	counts: ErasedCounts;
	/** Referrals the clinic keeps, now unlinked from her. */
	keptReferralIds: string[];
}

const count = async (rows: Promise<unknown[]>) => (await rows).length;

/**
 * Erases the client's record at her studio. Assumes the caller holds the request row's lock
 * and has checked the admin's right to decide it.
 */
export async function eraseClient(
	tx: Transaction,
	access: AccessContext,
	target: { clientId: string; studioId: string; requestId: string },
	now: Date
): Promise<ErasureResult> {
	const { clientId, studioId } = target;
	const [client] = await tx
		.select({ id: clients.id, userId: clients.userId, email: clients.email })
		.from(clients)
		.where(and(eq(clients.id, clientId), eq(clients.organisationId, studioId)))
		.for('update');
	if (!client) throw new Error('erasure: the client record vanished under its request lock');

	const [user] = client.userId
		? await tx
				.select({ id: users.id, email: users.email })
				.from(users)
				.where(eq(users.id, client.userId))
		: [];
	const addresses = [...new Set([client.email, user?.email].filter((e): e is string => !!e))];

	// 1. The log first, while her key still exists.
	await recordAccess(tx, access, {
		action: 'client.erased',
		outcome: 'success',
		target: { type: 'erasure_request', id: target.requestId },
		clientId
	});

	// 2. What the clinic keeps: unlinked from her, hidden from the studio.
	const kept = await tx
		.update(referrals)
		.set({ clientId: null, studioErasedAt: now, updatedAt: now })
		.where(and(eq(referrals.clientId, clientId), isNotNull(referrals.sentAt)))
		.returning({ id: referrals.id, clinicId: referrals.clinicId, physioId: referrals.physioId });
	const keptIds = kept.map((r) => r.id);
	const counts: ErasedCounts = {
		referralsKeptByClinic: kept.length,
		assessmentsKeptByClinic: await count(
			tx
				.update(assessments)
				.set({ clientId: null })
				.where(eq(assessments.clientId, clientId))
				.returning({ id: assessments.id })
		),
		clearancesKeptByClinic: await count(
			tx
				.update(clearances)
				.set({ clientId: null })
				.where(eq(clearances.clientId, clientId))
				.returning({ id: clearances.id })
		)
	};
	if (keptIds.length) {
		// The studio's own trace of having seen them in its lists.
		await tx
			.delete(referralListViews)
			.where(
				and(
					inArray(referralListViews.referralId, keptIds),
					inArray(
						referralListViews.userId,
						tx
							.select({ id: memberships.userId })
							.from(memberships)
							.where(eq(memberships.organisationId, studioId))
					)
				)
			);
	}

	// 3. The studio's own: drafts it never sent, her cells in plans, then her record (its
	//    cascades take screenings, consents, self-care, plan places and review requests).
	counts.draftReferrals = await count(
		tx
			.delete(referrals)
			.where(and(eq(referrals.clientId, clientId), isNull(referrals.sentAt)))
			.returning({ id: referrals.id })
	);
	const cell = JSON.stringify([{ clientId }]);
	counts.planChecksCleaned = await count(
		tx
			.update(plans)
			.set({
				readyCheck: sql`jsonb_set(${plans.readyCheck}, '{cells}', coalesce((
					select jsonb_agg(c) from jsonb_array_elements(${plans.readyCheck}->'cells') c
					where c->>'clientId' <> ${clientId}), '[]'::jsonb))`
			})
			.where(
				and(eq(plans.organisationId, studioId), sql`${plans.readyCheck}->'cells' @> ${cell}::jsonb`)
			)
			.returning({ id: plans.id })
	);
	const studioPlans = tx
		.select({ id: plans.id })
		.from(plans)
		.where(eq(plans.organisationId, studioId));
	await tx
		.update(planOverrides)
		.set({
			cells: sql`coalesce((select jsonb_agg(c) from jsonb_array_elements(${planOverrides.cells}) c
				where c->>'clientId' <> ${clientId}), '[]'::jsonb)`
		})
		.where(
			and(inArray(planOverrides.planId, studioPlans), sql`${planOverrides.cells} @> ${cell}::jsonb`)
		);
	counts.planOverridesRemoved = await count(
		tx
			.delete(planOverrides)
			.where(
				and(
					inArray(planOverrides.planId, studioPlans),
					sql`jsonb_array_length(${planOverrides.cells}) = 0`
				)
			)
			.returning({ id: planOverrides.id })
	);
	const [cascaded] = await tx
		.execute<Record<string, number>>(
			sql`
		select
			(select count(*)::int from screenings where client_id = ${clientId}) as screenings,
			(select count(*)::int from consents where client_id = ${clientId}) as consents,
			(select count(*)::int from self_checks where client_id = ${clientId}) as "selfChecks",
			(select count(*)::int from home_practice_sessions where client_id = ${clientId}) as "practiceSessions",
			(select count(*)::int from plan_clients where client_id = ${clientId}) as "planPlaces"
	`
		)
		.then((r) => r.rows);
	Object.assign(counts, cascaded);
	await tx.delete(clients).where(eq(clients.id, clientId));
	counts.clientRecords = 1;

	// 4. Her sign-in and every trace of her address. Someone who also works at a studio or a
	//    clinic keeps her staff account: only the client record was hers to erase.
	counts.signIns = 0;
	if (user) {
		const [staff] = await tx
			.select({ id: memberships.id })
			.from(memberships)
			.where(eq(memberships.userId, user.id))
			.limit(1);
		if (!staff) {
			await tx.delete(users).where(eq(users.id, user.id));
			counts.signIns = 1;
		}
	}
	if (addresses.length) {
		await tx.delete(verificationTokens).where(inArray(verificationTokens.identifier, addresses));
		await tx.delete(rateLimitHits).where(inArray(rateLimitHits.key, addresses));
		await tx.delete(outbox).where(inArray(outbox.to, addresses));
		await tx
			.delete(invitations)
			.where(and(eq(invitations.organisationId, studioId), inArray(invitations.email, addresses)));
	}
	// Mail to her colleagues that links to her record (a clearance set, a review due): the
	// link would lead nowhere now, and the queue is no archive.
	await tx.delete(outbox).where(sql`position(${clientId} in ${outbox.text}) > 0`);
	await tx.delete(subjectKeys).where(eq(subjectKeys.clientId, clientId));
	forgetSubjectKey(clientId);

	// 5. Mail: the confirmation to her; each clinic that keeps a referral is told the studio
	//    erased its copy (no name, no detail: a link to the clinic's own referral).
	for (const to of addresses) {
		await queueNotification(tx, { to, kind: 'erasure.approved', link: config().ORIGIN });
	}
	for (const referral of kept) {
		const recipients = await clinicRecipients(tx, referral.clinicId, referral.physioId);
		await notifyAll(tx, recipients, 'erasure.clinic_informed', referral.id);
	}
	return { counts, keptReferralIds: keptIds };
}
