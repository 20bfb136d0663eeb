import { and, count, eq, sql } from 'drizzle-orm';
import type { MemberRole, OrganisationKind } from '../actor';
import type { Caller } from '../context';
import { db } from '../db';
import { invitations, memberships, users } from '../db/schema';
import { ProblemError, notFound } from '../http/problem';
import { assertArea, assertSelf, type Area } from './policy';
import { activeMemberships } from '../scope';
import { pendingInvitation } from './members';

// ---------------------------------------------------------------- the person herself

export interface Me {
	id: string;
	email: string;
	name: string | null;
	memberships: Array<{
		organisationId: string;
		organisationName: string;
		kind: OrganisationKind;
		role: MemberRole;
	}>;
	clientId: string | null;
}

/** Policy: self only. Audit: none (her own account, no client data). */
export function describeMe(caller: Caller): Me {
	assertSelf(caller.actor, caller.actor.userId);
	const { actor } = caller;
	return {
		id: actor.userId,
		email: actor.email,
		name: actor.name,
		memberships: actor.memberships.map((m) => ({ ...m })),
		clientId: actor.clientId
	};
}

/** Policy: self, and only an organisation she belongs to. Audit: none (a preference). */
export function chooseOrganisation(caller: Caller, organisationId: string): string {
	assertSelf(caller.actor, caller.actor.userId);
	const held = caller.actor.memberships.find((m) => m.organisationId === organisationId);
	if (!held) throw notFound('You are not a member of that organisation.');
	return held.organisationId;
}

// ---------------------------------------------------------------- her own settings
// Her millimetres per finger width, for showing finger widths as an mm estimate (display only,
// never a criterion); null means the default.

/** The range a finger-width factor may take, in millimetres per finger width. */
export const FINGER_FACTOR_MIN = 5;
export const FINGER_FACTOR_MAX = 40;

/** Policy: a person reads her own setting (assertSelf). Audit: none (a preference, no client data). */
export async function getFingerFactor(caller: Caller): Promise<number | null> {
	assertSelf(caller.actor, caller.actor.userId);
	const [row] = await db()
		.select({ mmPerFinger: users.mmPerFinger })
		.from(users)
		.where(eq(users.id, caller.actor.userId));
	return row?.mmPerFinger ?? null;
}

/** Policy: a person edits her own setting (assertSelf). Audit: none (a preference, no client data). */
export async function setFingerFactor(
	caller: Caller,
	mmPerFinger: number | null
): Promise<number | null> {
	assertSelf(caller.actor, caller.actor.userId);
	if (
		mmPerFinger !== null &&
		!(
			Number.isFinite(mmPerFinger) &&
			mmPerFinger >= FINGER_FACTOR_MIN &&
			mmPerFinger <= FINGER_FACTOR_MAX
		)
	) {
		throw new ProblemError('validation-failed', {
			detail: `A finger width is set as ${FINGER_FACTOR_MIN} to ${FINGER_FACTOR_MAX} mm.`,
			errors: [
				{
					pointer: '/mmPerFinger',
					message: `must be ${FINGER_FACTOR_MIN} to ${FINGER_FACTOR_MAX} mm, or empty for the default`
				}
			]
		});
	}
	const [row] = await db()
		.update(users)
		.set({ mmPerFinger })
		.where(eq(users.id, caller.actor.userId))
		.returning({ mmPerFinger: users.mmPerFinger });
	return row?.mmPerFinger ?? null;
}

// ---------------------------------------------------------------- dashboards

export interface AreaSummary {
	organisationName: string | null;
	kind: OrganisationKind | null;
	roles: MemberRole[];
	/** For clients: her client record, once her studio has linked it. */
	clientId: string | null;
	/** For admins: the organisation's active members and pending invitations. */
	activeMembers?: number;
	pendingInvitations?: number;
}

/** Policy: the area's role in the active organisation (or client). Audit: none (no client data). */
export async function summariseArea(caller: Caller, area: Area): Promise<AreaSummary> {
	assertArea(caller.actor, area);
	const held = activeMemberships(caller.actor);
	const summary: AreaSummary = {
		organisationName: held[0]?.organisationName ?? null,
		kind: held[0]?.kind ?? null,
		roles: held.map((m) => m.role),
		clientId: caller.actor.clientId
	};
	if (area !== 'admin') return summary;
	const orgId = caller.actor.activeOrganisationId!;
	const [members, pending] = await Promise.all([
		db()
			.select({ n: sql<number>`count(distinct ${memberships.userId})::int` })
			.from(memberships)
			.where(and(eq(memberships.organisationId, orgId), eq(memberships.active, true))),
		db()
			.select({ n: count() })
			.from(invitations)
			.where(and(eq(invitations.organisationId, orgId), pendingInvitation()))
	]);
	return { ...summary, activeMembers: members[0]?.n ?? 0, pendingInvitations: pending[0]?.n ?? 0 };
}
