import { and, asc, count, eq, gt, isNull, ne, sql } from 'drizzle-orm';
import { createHash, randomBytes } from 'node:crypto';
import type { Actor, MemberRole, OrganisationKind } from '../actor';
import { recordAccess, recordRefusal, type AccessContext } from '../audit';
import { config } from '../config';
import type { Caller } from '../context';
import { db, type Executor } from '../db';
import { invitations, memberships, organisations, sessions, users } from '../db/schema';
import { ProblemError, notFound } from '../http/problem';
import { queueMail } from '../mail/outbox';
import { assertAdmin, assertArea, assertRoleFits, assertSelf, rolesFor, type Area } from './policy';
import { activeMemberships } from '../scope';

// Organisations, memberships and invitations. Every exported function begins by asserting
// its policy rule (./policy.ts) and names it, with its access-log action, in one line.

export const INVITATION_DAYS = 7;

const asAdmin = (caller: Caller, organisationId: string): AccessContext => ({
	...caller.access,
	role: 'admin',
	organisationId
});

/** Refuses with a 404 and records the refusal. */
async function refuse(caller: Caller, target: { type: string; id: string }): Promise<never> {
	await recordRefusal(caller.access, { action: 'access.denied', target });
	throw notFound();
}

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

// ---------------------------------------------------------------- members (admin)

export interface MemberRow {
	membershipId: string;
	userId: string;
	name: string | null;
	email: string;
	role: MemberRole;
	active: boolean;
	isSelf: boolean;
}

export interface InvitationRow {
	id: string;
	email: string;
	role: MemberRole;
	createdAt: Date;
	expiresAt: Date;
}

export interface MemberList {
	organisationId: string;
	organisationName: string;
	kind: OrganisationKind;
	roles: MemberRole[];
	members: MemberRow[];
	invitations: InvitationRow[];
}

const pendingInvitation = () =>
	and(
		isNull(invitations.acceptedAt),
		isNull(invitations.revokedAt),
		gt(invitations.expiresAt, sql`now()`)
	);

/** Policy: admin of the active organisation. Audit: none (membership data, no client data). */
export async function listMembers(caller: Caller): Promise<MemberList> {
	const admin = assertAdmin(caller.actor);
	const orgId = admin.organisationId;
	const [members, pending] = await Promise.all([
		db()
			.select({
				membershipId: memberships.id,
				userId: users.id,
				name: users.name,
				email: users.email,
				role: memberships.role,
				active: memberships.active
			})
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(eq(memberships.organisationId, orgId))
			.orderBy(asc(memberships.active), asc(users.name), asc(memberships.role)),
		db()
			.select({
				id: invitations.id,
				email: invitations.email,
				role: invitations.role,
				createdAt: invitations.createdAt,
				expiresAt: invitations.expiresAt
			})
			.from(invitations)
			.where(and(eq(invitations.organisationId, orgId), pendingInvitation()))
			.orderBy(asc(invitations.createdAt))
	]);
	return {
		organisationId: orgId,
		organisationName: admin.organisationName,
		kind: admin.kind,
		roles: rolesFor(admin.kind),
		// Active members first (false sorts before true ascending, so reverse the groups).
		members: [...members.filter((m) => m.active), ...members.filter((m) => !m.active)].map((m) => ({
			...m,
			isSelf: m.userId === caller.actor.userId
		})),
		invitations: pending
	};
}

export const invitationTokenHash = (token: string) =>
	createHash('sha256').update(token).digest('hex');

/** Policy: admin of the active organisation, a role that organisation hands out. Audit: invitation.sent. */
export async function inviteMember(
	caller: Caller,
	input: { email: string; role: MemberRole }
): Promise<{ invitationId: string }> {
	const admin = assertAdmin(caller.actor);
	assertRoleFits(admin.kind, input.role);
	const email = input.email.toLowerCase();
	return db().transaction(async (tx) => {
		const [existing] = await tx
			.select({ id: memberships.id })
			.from(memberships)
			.innerJoin(users, eq(users.id, memberships.userId))
			.where(
				and(
					eq(memberships.organisationId, admin.organisationId),
					eq(users.email, email),
					eq(memberships.role, input.role),
					eq(memberships.active, true)
				)
			);
		if (existing) {
			throw new ProblemError('conflict', {
				detail: `${email} is already a member here as ${input.role}.`
			});
		}
		const token = randomBytes(32).toString('base64url');
		const [row] = await tx
			.insert(invitations)
			.values({
				organisationId: admin.organisationId,
				email,
				role: input.role,
				tokenHash: invitationTokenHash(token),
				invitedBy: caller.actor.userId,
				expiresAt: new Date(Date.now() + INVITATION_DAYS * 24 * 3600 * 1000)
			})
			.returning({ id: invitations.id });
		await queueInvitationMail(tx, {
			to: email,
			token,
			organisationName: admin.organisationName,
			role: input.role,
			invitedBy: caller.actor.name ?? caller.actor.email
		});
		await recordAccess(tx, asAdmin(caller, admin.organisationId), {
			action: 'invitation.sent',
			outcome: 'success',
			target: { type: 'invitation', id: row!.id }
		});
		return { invitationId: row!.id };
	});
}

async function queueInvitationMail(
	executor: Executor,
	mail: { to: string; token: string; organisationName: string; role: MemberRole; invitedBy: string }
): Promise<void> {
	const link = `${config().ORIGIN}/invite/${mail.token}`;
	const roleName = mail.role === 'physiotherapist' ? 'physiotherapist' : mail.role;
	await queueMail(executor, {
		to: mail.to,
		kind: 'invitation',
		subject: `You are invited to ${mail.organisationName} on Seamwell`,
		text: [
			`${mail.invitedBy} has invited you to join ${mail.organisationName} on Seamwell as ${roleName}.`,
			'',
			`Accept the invitation here (the link works once, for ${INVITATION_DAYS} days):`,
			link,
			'',
			'If you did not expect this, ignore this mail: nothing happens unless you open the link.'
		].join('\n')
	});
}

/** Policy: admin of the invitation's organisation (else 404). Audit: invitation.revoked. */
export async function revokeInvitation(caller: Caller, invitationId: string): Promise<void> {
	const admin = assertAdmin(caller.actor);
	const done = await db().transaction(async (tx) => {
		const revoked = await tx
			.update(invitations)
			.set({ revokedAt: new Date() })
			.where(
				and(
					eq(invitations.id, invitationId),
					eq(invitations.organisationId, admin.organisationId),
					pendingInvitation()
				)
			)
			.returning({ id: invitations.id });
		if (revoked.length === 0) return false;
		await recordAccess(tx, asAdmin(caller, admin.organisationId), {
			action: 'invitation.revoked',
			outcome: 'success',
			target: { type: 'invitation', id: invitationId }
		});
		return true;
	});
	if (!done) await refuse(caller, { type: 'invitation', id: invitationId });
}

async function membershipInOrg(executor: Executor, membershipId: string, organisationId: string) {
	const [row] = await executor
		.select({
			id: memberships.id,
			userId: memberships.userId,
			role: memberships.role,
			active: memberships.active
		})
		.from(memberships)
		.where(and(eq(memberships.id, membershipId), eq(memberships.organisationId, organisationId)))
		.for('update');
	return row;
}

/** An organisation keeps at least one active admin: the change is refused otherwise. */
async function assertAdminRemains(
	executor: Executor,
	organisationId: string,
	leavingMembershipId: string
): Promise<void> {
	const [row] = await executor
		.select({ n: count() })
		.from(memberships)
		.where(
			and(
				eq(memberships.organisationId, organisationId),
				eq(memberships.role, 'admin'),
				eq(memberships.active, true),
				ne(memberships.id, leavingMembershipId)
			)
		);
	if ((row?.n ?? 0) === 0) {
		throw new ProblemError('conflict', {
			detail: 'An organisation keeps at least one admin: make someone else admin first.'
		});
	}
}

/** Policy: admin of the membership's organisation, a role it hands out. Audit: member.role_changed. */
export async function changeMemberRole(
	caller: Caller,
	input: { membershipId: string; role: MemberRole }
): Promise<void> {
	const admin = assertAdmin(caller.actor);
	assertRoleFits(admin.kind, input.role);
	const found = await db().transaction(async (tx) => {
		const member = await membershipInOrg(tx, input.membershipId, admin.organisationId);
		if (!member || !member.active) return false;
		if (member.role === input.role) return true;
		if (member.role === 'admin') await assertAdminRemains(tx, admin.organisationId, member.id);
		const [clash] = await tx
			.select({ id: memberships.id })
			.from(memberships)
			.where(
				and(
					eq(memberships.userId, member.userId),
					eq(memberships.organisationId, admin.organisationId),
					eq(memberships.role, input.role)
				)
			);
		if (clash) {
			throw new ProblemError('conflict', {
				detail: `This person already holds the ${input.role} role here (perhaps deactivated).`
			});
		}
		await tx.update(memberships).set({ role: input.role }).where(eq(memberships.id, member.id));
		await recordAccess(tx, asAdmin(caller, admin.organisationId), {
			action: 'member.role_changed',
			outcome: 'success',
			target: { type: 'membership', id: member.id }
		});
		return true;
	});
	if (!found) await refuse(caller, { type: 'membership', id: input.membershipId });
}

/**
 * Policy: admin of the membership's organisation. Audit: member.deactivated.
 * Her sessions end at once (ASVS 7.4.2); with no active membership left she can no longer sign in.
 */
export async function deactivateMember(caller: Caller, membershipId: string): Promise<void> {
	const admin = assertAdmin(caller.actor);
	const found = await db().transaction(async (tx) => {
		const member = await membershipInOrg(tx, membershipId, admin.organisationId);
		if (!member || !member.active) return false;
		if (member.role === 'admin') await assertAdminRemains(tx, admin.organisationId, member.id);
		await tx
			.update(memberships)
			.set({ active: false, deactivatedAt: new Date() })
			.where(eq(memberships.id, member.id));
		const [remaining] = await tx
			.select({ n: count() })
			.from(memberships)
			.where(and(eq(memberships.userId, member.userId), eq(memberships.active, true)));
		if ((remaining?.n ?? 0) === 0) {
			await tx.update(users).set({ active: false }).where(eq(users.id, member.userId));
		}
		await tx.delete(sessions).where(eq(sessions.userId, member.userId));
		await recordAccess(tx, asAdmin(caller, admin.organisationId), {
			action: 'member.deactivated',
			outcome: 'success',
			target: { type: 'membership', id: member.id }
		});
		return true;
	});
	if (!found) await refuse(caller, { type: 'membership', id: membershipId });
}

// ---------------------------------------------------------------- accepting an invitation

export type InvitationState = 'pending' | 'expired' | 'accepted' | 'revoked' | 'unknown';

export interface InvitationView {
	state: InvitationState;
	email: string | null;
	organisationName: string | null;
	role: MemberRole | null;
}

/** Policy: whoever holds the link (it names only what the mail already said). Audit: none. */
export async function inspectInvitation(token: string): Promise<InvitationView> {
	const [row] = await db()
		.select({
			email: invitations.email,
			role: invitations.role,
			organisationName: organisations.name,
			expiresAt: invitations.expiresAt,
			acceptedAt: invitations.acceptedAt,
			revokedAt: invitations.revokedAt
		})
		.from(invitations)
		.innerJoin(organisations, eq(organisations.id, invitations.organisationId))
		.where(eq(invitations.tokenHash, invitationTokenHash(token)));
	if (!row) return { state: 'unknown', email: null, organisationName: null, role: null };
	const state: InvitationState = row.revokedAt
		? 'revoked'
		: row.acceptedAt
			? 'accepted'
			: row.expiresAt.getTime() <= Date.now()
				? 'expired'
				: 'pending';
	return { state, email: row.email, organisationName: row.organisationName, role: row.role };
}

/**
 * Policy: the holder of a pending link, and — when signed in — only as the invited person.
 * Audit: invitation.accepted (refusals: invitation.accepted, refused).
 * Makes (or reactivates) the person and the membership; the link then works no more.
 */
export async function acceptInvitation(
	token: string,
	actor: Actor | null,
	access: AccessContext
): Promise<{ email: string; userId: string }> {
	const hash = invitationTokenHash(token);
	const result = await db().transaction(async (tx) => {
		const [inv] = await tx
			.select()
			.from(invitations)
			.where(eq(invitations.tokenHash, hash))
			.for('update');
		if (!inv || inv.acceptedAt || inv.revokedAt || inv.expiresAt.getTime() <= Date.now()) {
			return { ok: false as const, refused: 'This invitation can no longer be used.', id: inv?.id };
		}
		if (actor && actor.email !== inv.email) {
			return {
				ok: false as const,
				refused: `This invitation is for ${inv.email}. Sign out first, then open the link again.`,
				id: inv.id
			};
		}
		const userId = await ensureUser(tx, inv.email);
		await ensureMembership(tx, userId, inv.organisationId, inv.role);
		await tx.update(invitations).set({ acceptedAt: new Date() }).where(eq(invitations.id, inv.id));
		await recordAccess(
			tx,
			{ ...access, userId, role: inv.role, organisationId: inv.organisationId },
			{
				action: 'invitation.accepted',
				outcome: 'success',
				target: { type: 'invitation', id: inv.id }
			}
		);
		return { ok: true as const, email: inv.email, userId };
	});
	if (!result.ok) {
		await recordRefusal(access, {
			action: 'invitation.accepted',
			target: { type: 'invitation', id: result.id ?? 'unknown' }
		});
		throw new ProblemError('conflict', { detail: result.refused });
	}
	return { email: result.email, userId: result.userId };
}

async function ensureUser(executor: Executor, email: string): Promise<string> {
	const [created] = await executor
		.insert(users)
		.values({ email })
		.onConflictDoUpdate({ target: users.email, set: { active: true } })
		.returning({ id: users.id });
	return created!.id;
}

async function ensureMembership(
	executor: Executor,
	userId: string,
	organisationId: string,
	role: MemberRole
): Promise<void> {
	await executor
		.insert(memberships)
		.values({ userId, organisationId, role })
		.onConflictDoUpdate({
			target: [memberships.userId, memberships.organisationId, memberships.role],
			set: { active: true, deactivatedAt: null }
		});
}
