import { and, asc, count, eq, gt, isNull, ne, sql } from 'drizzle-orm';
import { createHash, randomBytes } from 'node:crypto';
import type { MemberRole, OrganisationKind } from '../actor';
import { recordAccess } from '../audit';
import { config } from '../config';
import type { Caller } from '../context';
import { db, type Executor } from '../db';
import { invitations, memberships, sessions, users } from '../db/schema';
import { ProblemError } from '../http/problem';
import { queueMail } from '../mail/outbox';
import { assertAdmin, assertRoleFits, rolesFor } from './policy';
import { INVITATION_DAYS, asAdmin, refuse } from './shared';

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

export const pendingInvitation = () =>
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
