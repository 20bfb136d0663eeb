import type { Actor, Membership } from './actor';

// Which organisations the caller may act for, and in which role: the one place that reads an
// actor's memberships. Every domain's policy.ts builds its may…/decide… rules on these.

const organisationsWhere = (actor: Actor, keep: (m: Membership) => boolean): string[] => [
	...new Set(actor.memberships.filter(keep).map((m) => m.organisationId))
];

/** The studios where she is an instructor. */
export function instructorStudioIds(actor: Actor): string[] {
	return organisationsWhere(actor, (m) => m.kind === 'studio' && m.role === 'instructor');
}

/** The clinics where she is a physiotherapist. */
export function physioClinicIds(actor: Actor): string[] {
	return organisationsWhere(actor, (m) => m.kind === 'clinic' && m.role === 'physiotherapist');
}

/** The organisations (studios and clinics) where she is an admin. */
export function adminOrganisationIds(actor: Actor): string[] {
	return organisationsWhere(actor, (m) => m.role === 'admin');
}

/** The studios where she is an admin (they answer their clients' requests to erase data). */
export function studioAdminIds(actor: Actor): string[] {
	return organisationsWhere(actor, (m) => m.kind === 'studio' && m.role === 'admin');
}

/** Her memberships in the organisation she has chosen to act in. */
export function activeMemberships(actor: Actor): Membership[] {
	return actor.memberships.filter((m) => m.organisationId === actor.activeOrganisationId);
}
