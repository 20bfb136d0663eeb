import { and, eq } from 'drizzle-orm';
import { config } from '../config';
import type { Executor } from '../db';
import { memberships, users } from '../db/schema';
import type { NotificationKind } from '../mail/notifications';
import { queueNotification } from '../mail/outbox';

// Who hears of a referral's hand-offs, and the mail itself: only that there is something to
// see, and a link — never a name, a measurement or a reason. Called inside the transaction
// of the change, so a mail exists exactly when the change was committed.

export const referralLink = (id: string) => `${config().ORIGIN}/referrals/${id}`;

/** The named physiotherapist, or every active physiotherapist of the clinic. */
export async function clinicRecipients(
	executor: Executor,
	clinicId: string,
	physioId: string | null
): Promise<string[]> {
	const rows = await executor
		.select({ email: users.email })
		.from(memberships)
		.innerJoin(users, eq(users.id, memberships.userId))
		.where(
			and(
				eq(memberships.organisationId, clinicId),
				eq(memberships.role, 'physiotherapist'),
				eq(memberships.active, true),
				eq(users.active, true),
				...(physioId ? [eq(users.id, physioId)] : [])
			)
		);
	return [...new Set(rows.map((r) => r.email))];
}

/** The instructor who opened the referral (if she still has an account). */
export async function instructorRecipient(
	executor: Executor,
	userId: string | null
): Promise<string[]> {
	if (!userId) return [];
	const [row] = await executor
		.select({ email: users.email })
		.from(users)
		.where(and(eq(users.id, userId), eq(users.active, true)));
	return row ? [row.email] : [];
}

export async function notifyAll(
	executor: Executor,
	recipients: readonly string[],
	kind: NotificationKind,
	referralId: string
): Promise<void> {
	for (const to of recipients) {
		await queueNotification(executor, { to, kind, link: referralLink(referralId) });
	}
}
