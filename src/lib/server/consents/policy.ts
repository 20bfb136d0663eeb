import type { Actor } from '../actor';
import { instructorStudioIds, adminOrganisationIds } from '../scope';

// Who may do what with consent to share. Pure functions of the actor and the record. Only the
// client herself gives or withdraws her consent; her studio's instructors may ask her to; the
// admins of the studio or clinic a grant names may read it (for their records and audits).

export interface ConsentScope {
	clientId: string;
	studioId: string;
	clinicId: string;
}

/** Her own grants (she is a client), or her organisations' (she is an admin). */
export function mayListConsents(actor: Actor): boolean {
	return actor.clientId !== null || adminOrganisationIds(actor).length > 0;
}

/** Reading one grant: the client herself, or an admin of the studio or the clinic it names. */
export function mayReadConsent(actor: Actor, consent: ConsentScope): boolean {
	if (actor.clientId === consent.clientId) return true;
	const admin = adminOrganisationIds(actor);
	return admin.includes(consent.studioId) || admin.includes(consent.clinicId);
}

/** Only the client herself gives consent, and only for her own record. */
export function mayGiveConsent(actor: Actor): actor is Actor & { clientId: string } {
	return actor.clientId !== null;
}

/** Withdrawing is as open as giving: the client herself, on any grant of hers. */
export function mayWithdrawConsent(actor: Actor, consent: ConsentScope): boolean {
	return actor.clientId === consent.clientId;
}

/** Asking her for consent: an instructor of the studio that keeps her record. */
export function mayRequestConsent(actor: Actor, client: { organisationId: string }): boolean {
	return instructorStudioIds(actor).includes(client.organisationId);
}

/** May she ask at all (before knowing which client): she teaches in a studio. */
export function mayRequestAnyConsent(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0;
}
