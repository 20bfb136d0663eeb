import { and, eq, isNull } from 'drizzle-orm';
import { consentStatus, normaliseScopes } from '../../domain/consent';
import { recordAccess } from '../audit';
import { config } from '../config';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { clients, consentEvents, consentRequests, consents, organisations } from '../db/schema';
import { fieldProblem, notFound, ProblemError } from '../http/problem';
import { queueNotification } from '../mail/outbox';
import { instructorRecipient } from '../referrals/notify';
import { markClearancesSharingEnded } from '../clearance/sharing-ended';
import { withdrawOpenReferrals } from '../referrals/sharing-ended';
import {
	mayGiveConsent,
	mayRequestAnyConsent,
	mayRequestConsent,
	mayWithdrawConsent
} from './policy';
import { type GiveConsentInput } from './reading';

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
