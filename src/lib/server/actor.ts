// The signed-in person as every route and service sees her: loaded once per request by
// hooks.server.ts into `locals.actor`.

export type OrganisationKind = 'studio' | 'clinic';
export type MemberRole = 'instructor' | 'physiotherapist' | 'admin';

export interface Membership {
	organisationId: string;
	organisationName: string;
	kind: OrganisationKind;
	role: MemberRole;
}

export interface Actor {
	userId: string;
	email: string;
	name: string | null;
	memberships: Membership[];
	/** The client record this person is, when she signs in as a client. */
	clientId: string | null;
	/** The organisation she has chosen to act in (one of her memberships), if any. */
	activeOrganisationId: string | null;
}
