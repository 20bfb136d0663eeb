import type { Actor } from '../actor';
import { instructorStudioIds } from '../scope';

// Who may do what with self-checks and home practice. Her self-checks are hers: the studio's
// instructors see them only while she shares them with that studio (else 404, never 403).

/** Her own self-checks and home practice: only the person linked to the client record. */
export function mayUseOwnSelfCare(actor: Actor): actor is Actor & { clientId: string } {
	return actor.clientId !== null;
}

export interface StudioClient {
	id: string;
	organisationId: string;
}

/** Her self-checks, studio-side: an instructor of her studio, while she shares with it. */
export function mayReadSelfChecks(actor: Actor, client: StudioClient, shared: boolean): boolean {
	return shared && instructorStudioIds(actor).includes(client.organisationId);
}

/** Give her a home practice and see how it goes: an instructor of her studio. */
export function mayManageHomePractice(actor: Actor, client: StudioClient): boolean {
	return instructorStudioIds(actor).includes(client.organisationId);
}

/** The dashboard's follow-ups: instructors of at least one studio. */
export function mayFollowUp(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0;
}
