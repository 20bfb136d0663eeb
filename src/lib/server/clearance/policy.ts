import type { ReferralState } from '../../domain/referral';
import type { Actor } from '../actor';
import { instructorStudioIds, physioClinicIds } from '../scope';

// Who may record and read assessments, and set and read clearances. Pure functions of the
// actor and the records; consent (read fresh, in the transaction) is checked by the service
// beside these. Anyone outside the loop gets 404 — a 403 would confirm the record exists.

export interface AssessmentScope {
	studioId: string;
	clinicId: string;
	physioId: string | null;
	state: ReferralState;
}

/** States in which the assigned physiotherapist records findings (accepted → assessed). */
export const ASSESSABLE_STATES: readonly ReferralState[] = ['accepted', 'assessed'];

/** States of a referral that let its physiotherapist set a clearance for the client. */
export const CLEARING_STATES: readonly ReferralState[] = ['accepted', 'assessed'];

/** The physiotherapist the referral is assigned to, in its clinic. */
export function isAssignedPhysio(actor: Actor, referral: AssessmentScope): boolean {
	return referral.physioId === actor.userId && physioClinicIds(actor).includes(referral.clinicId);
}

/** Recording an assessment: the assigned physiotherapist only (the state is checked apart). */
export function mayRecordAssessment(actor: Actor, referral: AssessmentScope): boolean {
	return isAssignedPhysio(actor, referral);
}

/**
 * Reading assessments: the clinic's physiotherapists — findings are the clinic's record. The
 * studio sees the clearance, and documents the physiotherapist marks shareable, not these.
 */
export function mayReadAssessment(actor: Actor, referral: AssessmentScope): boolean {
	return physioClinicIds(actor).includes(referral.clinicId) && referral.state !== 'draft';
}

/** The studio's side of the referral: it may know the referral, but not its findings (403). */
export function isReferringStudio(actor: Actor, referral: AssessmentScope): boolean {
	return instructorStudioIds(actor).includes(referral.studioId);
}

/**
 * Setting a clearance: a physiotherapist assigned to one of the client's referrals that is
 * accepted or assessed. Returns those referrals (empty: she may not).
 */
export function clearingReferrals<R extends AssessmentScope>(actor: Actor, referrals: R[]): R[] {
	return referrals.filter((r) => CLEARING_STATES.includes(r.state) && isAssignedPhysio(actor, r));
}

export type ClearanceViewer =
	| { kind: 'studio' }
	| { kind: 'client' }
	/** A clinic sees its own clearances only. */
	| { kind: 'clinic'; clinicId: string };

/**
 * Reading a client's clearance: instructors of her studio, the client herself, and the
 * physiotherapists of a clinic she was referred to (past a draft) — who see their own
 * clinic's clearances. Null: she may not (404).
 */
export function clearanceViewer(
	actor: Actor,
	client: { id: string; organisationId: string },
	referrals: AssessmentScope[]
): ClearanceViewer | null {
	if (instructorStudioIds(actor).includes(client.organisationId)) return { kind: 'studio' };
	if (actor.clientId === client.id) return { kind: 'client' };
	const clinics = physioClinicIds(actor);
	const referral = referrals.find((r) => r.state !== 'draft' && clinics.includes(r.clinicId));
	return referral ? { kind: 'clinic', clinicId: referral.clinicId } : null;
}

/** The studio's and clinic's review lists: instructors and physiotherapists. */
export function mayListReviews(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0 || physioClinicIds(actor).length > 0;
}
