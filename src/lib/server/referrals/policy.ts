import type { ReferralState, TransitionActor } from '../../domain/referral';
import { actorsInto, findTransition, type Transition } from '../../domain/referral';
import type { Actor } from '../actor';
import { instructorStudioIds, physioClinicIds } from '../scope';

// Who may see and move a referral. Pure functions of the actor and the referral; the service
// asserts one at the start of every exported function. A clinic never sees drafts; a
// physiotherapist of another clinic never sees the referral at all (404, not 403).

export interface ReferralScope {
	studioId: string;
	clinicId: string;
	physioId: string | null;
	state: ReferralState;
	/** Set when the studio erased the client's record: the studio's side is gone. */
	studioErasedAt?: Date | null;
}

/** The studio still holds this referral (it has not erased the client's record). */
const studioHolds = (referral: ReferralScope) => !referral.studioErasedAt;

/**
 * Listing clinics and their physiotherapists: anyone signed in (an instructor choosing where
 * to refer, a client choosing with whom to share). Names of organisations and their staff are
 * no client's data.
 */
export function mayListClinics(actor: Actor): boolean {
	return actor.userId.length > 0;
}

/** Referral lists: instructors (their studios' referrals) and physiotherapists (their clinics'). */
export function mayListReferrals(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0 || physioClinicIds(actor).length > 0;
}

/** Opening a draft: she teaches in a studio (the client must be of one of them). */
export function mayOpenReferral(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0;
}

/** Referring this client: an instructor of the studio that keeps her record. */
export function mayReferClient(actor: Actor, client: { organisationId: string }): boolean {
	return instructorStudioIds(actor).includes(client.organisationId);
}

/** Instructors of the referring studio; physiotherapists of the clinic once it is sent. */
export function mayReadReferral(actor: Actor, referral: ReferralScope): boolean {
	if (studioHolds(referral) && instructorStudioIds(actor).includes(referral.studioId)) return true;
	return physioClinicIds(actor).includes(referral.clinicId) && referral.state !== 'draft';
}

/** In which of the transition table's parts she stands to this referral. */
export function transitionRoles(actor: Actor, referral: ReferralScope): TransitionActor[] {
	const roles: TransitionActor[] = [];
	if (studioHolds(referral) && instructorStudioIds(actor).includes(referral.studioId)) {
		roles.push('studio_instructor');
	}
	if (physioClinicIds(actor).includes(referral.clinicId)) {
		if (referral.physioId === null || referral.physioId === actor.userId) {
			roles.push('clinic_physio');
		}
		if (referral.physioId === actor.userId) roles.push('assigned_physio');
	}
	return roles;
}

export type TransitionDecision =
	| { kind: 'allowed'; transition: Transition }
	/** She may see it but her role may not make this move (403). */
	| { kind: 'forbidden' }
	/** The move does not exist from the current state (409 invalid-transition). */
	| { kind: 'invalid' };

/**
 * Decides a move for one who may see the referral. Her role is judged first — may anyone in
 * her place ever lead a referral into `to`? — then the state: a move the table lacks from here
 * is invalid, and a move that exists but belongs to someone else (another physiotherapist) is
 * forbidden.
 */
export function decideTransition(
	actor: Actor,
	referral: ReferralScope,
	to: ReferralState
): TransitionDecision {
	const roles = transitionRoles(actor, referral);
	const sides = (r: TransitionActor) =>
		r === 'studio_instructor' ? 'studio' : ('clinic' as 'studio' | 'clinic');
	const mySides = new Set(
		[
			instructorStudioIds(actor).includes(referral.studioId) ? 'studio' : null,
			physioClinicIds(actor).includes(referral.clinicId) ? 'clinic' : null
		].filter((s) => s !== null)
	);
	if (!actorsInto(to).some((a) => mySides.has(sides(a)))) return { kind: 'forbidden' };
	const transition = findTransition(referral.state, to);
	if (!transition) return { kind: 'invalid' };
	if (!roles.includes(transition.by)) return { kind: 'forbidden' };
	return { kind: 'allowed', transition };
}
