import type { Actor } from '../actor';
import { instructorStudioIds } from '../scope';

// Who may do what with exercises and session plans. Plans and a studio's own exercises belong
// to the studio: any of its instructors may open, edit, check and mark them ready. Nobody else
// learns that they exist (404).

/** Plans and the exercise library: instructors of at least one studio. */
export function mayUsePlans(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0;
}

export interface StudioScope {
	organisationId: string;
}

/** A plan or a studio exercise: an instructor of its studio. */
export function mayUseStudioRecord(actor: Actor, record: StudioScope): boolean {
	return instructorStudioIds(actor).includes(record.organisationId);
}

/**
 * The studio a new plan or exercise goes to: her active organisation when she teaches there,
 * else her first studio. Null when she teaches nowhere.
 */
export function studioForNew(actor: Actor): string | null {
	const studios = instructorStudioIds(actor);
	if (actor.activeOrganisationId && studios.includes(actor.activeOrganisationId)) {
		return actor.activeOrganisationId;
	}
	return studios[0] ?? null;
}

/** Her own "in class, for you" list: only the person linked to the client record. */
export function mayReadOwnPlans(actor: Actor): actor is Actor & { clientId: string } {
	return actor.clientId !== null;
}
