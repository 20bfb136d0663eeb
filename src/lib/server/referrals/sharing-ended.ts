import { and, eq, inArray } from 'drizzle-orm';
import { CONSENT_WITHDRAWN_REASON, OPEN_SHARED_STATES } from '../../domain/referral';
import { recordAccess } from '../audit';
import type { Caller } from '../context';
import type { Transaction } from '../db';
import { referralEvents, referrals } from '../db/schema';
import type { HeldPair } from '../consents/grants';
import { clinicRecipients, instructorRecipient, notifyAll } from './notify';

// When a client withdraws consent, the clinic can no longer act on her open referrals: each
// moves to withdrawn with the reason "consent withdrawn", recorded as her doing, in the
// withdrawal's own transaction. The consents service calls this after asserting its policy
// (only the client herself withdraws), so it asserts none of its own.

/** Withdraws the pair's sent and accepted referrals; returns how many moved. */
export async function withdrawOpenReferrals(
	tx: Transaction,
	caller: Caller,
	pair: HeldPair
): Promise<number> {
	// Lock the open referrals first, so a physiotherapist's concurrent accept either lands
	// before (and is withdrawn here) or finds the state changed (409).
	const open = await tx
		.select({
			id: referrals.id,
			state: referrals.state,
			clinicId: referrals.clinicId,
			physioId: referrals.physioId,
			createdBy: referrals.createdBy
		})
		.from(referrals)
		.where(
			and(
				eq(referrals.clientId, pair.clientId),
				eq(referrals.studioId, pair.studioId),
				eq(referrals.clinicId, pair.clinicId),
				inArray(referrals.state, [...OPEN_SHARED_STATES])
			)
		)
		.for('update');
	for (const referral of open) {
		await tx
			.update(referrals)
			.set({ state: 'withdrawn', updatedAt: new Date() })
			.where(eq(referrals.id, referral.id));
		await tx.insert(referralEvents).values({
			referralId: referral.id,
			fromState: referral.state,
			toState: 'withdrawn',
			actorUserId: caller.actor.userId,
			actorRole: 'client',
			reason: CONSENT_WITHDRAWN_REASON
		});
		await recordAccess(tx, caller.access, {
			action: 'referral.transitioned',
			outcome: 'success',
			target: { type: 'referral', id: referral.id },
			clientId: pair.clientId
		});
		// Both sides hear that sharing ended: the clinic, and the instructor who referred her.
		const recipients = [
			...(await clinicRecipients(tx, referral.clinicId, referral.physioId)),
			...(await instructorRecipient(tx, referral.createdBy))
		];
		await notifyAll(tx, [...new Set(recipients)], 'referral.sharing_ended', referral.id);
	}
	return open.length;
}
