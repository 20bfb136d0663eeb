import { and, asc, eq } from 'drizzle-orm';
import { REFERRAL_STATE_LABELS, type ReferralState, type Transition } from '../../domain/referral';
import type { TransitionData } from '$lib/referrals/schemas';
import { recordAccess, recordRefusal } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import { clients, referralEvents, referrals, referralSnapshots, screenings } from '../db/schema';
import { fieldProblem, ProblemError, type ProblemSlug } from '../http/problem';
import { generateReferralLetter } from './letter';
import type { NotificationKind } from '../mail/notifications';
import { clinicRecipients, instructorRecipient, notifyAll } from './notify';
import { decideTransition } from './policy';
import { snapshotClient, snapshotScreenings } from './snapshot';
import { type ReferralRow, heldClientId, visibleReferral } from './shared';

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
