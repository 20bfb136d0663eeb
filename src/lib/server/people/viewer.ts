import type { Actor, MemberRole, OrganisationKind } from '../actor';
import { areasOf, type Area } from './policy';
import { activeMemberships } from '../scope';

// What the shell shows a signed-in person: her name, where she acts, and the areas her roles
// open (the navigation mirrors the server's rules; it never replaces them).

export interface Viewer {
	name: string;
	email: string;
	organisations: Array<{ id: string; name: string; kind: OrganisationKind }>;
	activeOrganisationId: string | null;
	activeOrganisationName: string | null;
	roles: MemberRole[];
	areas: Area[];
}

/** The landing page of each area, in the order `areasOf` prefers. */
export const AREA_HOME: Record<Area, string> = {
	instructor: '/instructor',
	physiotherapist: '/physio',
	admin: '/admin',
	client: '/client'
};

export function viewerOf(actor: Actor): Viewer {
	const organisations = new Map<string, { id: string; name: string; kind: OrganisationKind }>();
	for (const m of actor.memberships) {
		organisations.set(m.organisationId, {
			id: m.organisationId,
			name: m.organisationName,
			kind: m.kind
		});
	}
	const areas = areasOf(actor);
	const active = activeMemberships(actor);
	return {
		name: actor.name ?? actor.email,
		email: actor.email,
		organisations: [...organisations.values()],
		activeOrganisationId: actor.activeOrganisationId,
		activeOrganisationName: active[0]?.organisationName ?? null,
		roles: active.map((m) => m.role),
		areas
	};
}
