import type { Actor, MemberRole, Membership, OrganisationKind } from '../actor';
import { ProblemError, notFound } from '../http/problem';
import { activeMemberships } from '../scope';

// Pure rules about people: who may see which area, who may manage an organisation's
// members. No I/O. A refusal is a 404 wherever a 403 would confirm that something exists.

export type Area = 'instructor' | 'physiotherapist' | 'admin' | 'client';

export function hasActiveRole(actor: Actor, role: MemberRole): boolean {
	return activeMemberships(actor).some((m) => m.role === role);
}

/**
 * The client area belongs to people linked to a client record. Until client records exist,
 * a signed-in person with no membership is treated as a client whose studio has not added
 * her yet (she sees an empty client dashboard, nothing else).
 */
export function isClient(actor: Actor): boolean {
	return actor.clientId !== null || actor.memberships.length === 0;
}

export function mayEnterArea(actor: Actor, area: Area): boolean {
	return area === 'client' ? isClient(actor) : hasActiveRole(actor, area);
}

/** The areas she may enter right now, in the order her work usually begins. */
export function areasOf(actor: Actor): Area[] {
	const order: Area[] = ['instructor', 'physiotherapist', 'admin', 'client'];
	return order.filter((area) => mayEnterArea(actor, area));
}

/** Route ids under (app) that belong to one role's area; anything else there needs only a sign-in. */
const AREA_PREFIXES: Array<[string, Area]> = [
	['/(app)/instructor', 'instructor'],
	['/(app)/physio', 'physiotherapist'],
	['/(app)/admin', 'admin'],
	['/(app)/client', 'client']
];

export type RouteDecision = 'public' | 'signin' | 'allow' | 'hidden';

/** The hooks' route guard: the server decides, the navigation only mirrors it. */
export function decideRoute(routeId: string | null, actor: Actor | null): RouteDecision {
	if (!routeId || !routeId.startsWith('/(app)/')) return 'public';
	if (!actor) return 'signin';
	const area = AREA_PREFIXES.find(
		([prefix]) => routeId === prefix || routeId.startsWith(prefix + '/')
	)?.[1];
	if (!area) return 'allow';
	return mayEnterArea(actor, area) ? 'allow' : 'hidden';
}

export function assertArea(actor: Actor, area: Area): void {
	if (!mayEnterArea(actor, area)) throw notFound();
}

/** Admin of the organisation she is acting in: returns that organisation's id. */
export function assertAdmin(actor: Actor): Membership {
	const admin = activeMemberships(actor).find((m) => m.role === 'admin');
	if (!admin) throw notFound();
	return admin;
}

/** Roles a studio or a clinic hands out: instructor or admin in a studio, physiotherapist or admin in a clinic. */
export function rolesFor(kind: OrganisationKind): MemberRole[] {
	return kind === 'studio' ? ['instructor', 'admin'] : ['physiotherapist', 'admin'];
}

export function assertRoleFits(kind: OrganisationKind, role: MemberRole): void {
	if (!rolesFor(kind).includes(role)) {
		throw new ProblemError('validation-failed', {
			detail: `A ${kind} has no ${role} role.`,
			errors: [{ pointer: '/role', message: `choose ${rolesFor(kind).join(' or ')}` }]
		});
	}
}

/** Anyone signed in may read her own account; nobody reads another's through this rule. */
export function assertSelf(actor: Actor, userId: string): void {
	if (actor.userId !== userId) throw notFound();
}

/** Being an admin alone grants no reading of clinical data: only these roles may. */
export function mayReadClinicalData(actor: Actor): boolean {
	return hasActiveRole(actor, 'instructor') || hasActiveRole(actor, 'physiotherapist');
}
