import type { Actor } from '../actor';
import { instructorStudioIds } from '../scope';

// Who may do what with client records. Pure functions of the actor and the record's studio;
// the service asserts one at the start of every exported function. Instructors keep the
// records of their own studio; a client sees only her own record.

/** May list and search client records: she teaches in at least one studio. */
export function mayListClients(actor: Actor): boolean {
	return instructorStudioIds(actor).length > 0;
}

/**
 * The studio a new client record goes to: the one asked for when she teaches there, else her
 * active organisation when she teaches there, else her only studio. Null when none fits.
 */
export function studioForNewClient(actor: Actor, requested?: string): string | null {
	const studios = instructorStudioIds(actor);
	if (requested !== undefined) return studios.includes(requested) ? requested : null;
	if (actor.activeOrganisationId && studios.includes(actor.activeOrganisationId)) {
		return actor.activeOrganisationId;
	}
	return studios.length === 1 ? studios[0]! : null;
}

export interface ClientScope {
	id: string;
	organisationId: string;
}

/** Instructors of her studio, and the client herself. */
export function mayReadClient(actor: Actor, client: ClientScope): boolean {
	return instructorStudioIds(actor).includes(client.organisationId) || actor.clientId === client.id;
}

/** Change her record, record screenings, invite her: instructors of her studio only. */
export function mayWriteClient(actor: Actor, client: ClientScope): boolean {
	return instructorStudioIds(actor).includes(client.organisationId);
}

/** Her own record, in plain words: only the person linked to it. */
export function mayReadOwnRecord(actor: Actor): actor is Actor & { clientId: string } {
	return actor.clientId !== null;
}
