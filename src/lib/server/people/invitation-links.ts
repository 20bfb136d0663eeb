import { eq } from 'drizzle-orm';
import type { Actor, MemberRole } from '../actor';
import { recordAccess, recordRefusal, type AccessContext } from '../audit';
import { db, type Executor } from '../db';
import { invitations, memberships, organisations, users } from '../db/schema';
import { ProblemError } from '../http/problem';
import { invitationTokenHash } from './members';

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
