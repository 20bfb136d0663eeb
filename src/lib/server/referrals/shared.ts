import { eq } from 'drizzle-orm';
import { type AuditAction } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { readOnce } from '../db/scope';
import { referrals } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { mayReadReferral } from './policy';

export type ReferralRow = typeof referrals.$inferSelect;

/**
 * The client a referral belongs to, for work that needs her record. Only a referral the
 * studio erased has none, and nobody reaches such work for it: the studio no longer sees it
 * and the clinic's sharing with her ended with the erasure. Should that ever change, the
 * answer is a refusal, not a crash.
 */
export function heldClientId(row: { clientId: string | null }): string {
	if (row.clientId === null) {
		throw new ProblemError('conflict', {
			detail: "The studio erased this client's record; the referral can only be read."
		});
	}
	return row.clientId;
}

/** A referral's row, read once per page load when several services of the page check it. */
export function referralRow(id: string): Promise<ReferralRow | undefined> {
	return readOnce(`referral:${id}`, async () => {
		const [row] = await db().select().from(referrals).where(eq(referrals.id, id));
		return row;
	});
}

/**
 * A referral the caller may see by `may` (by default: reading it, from either side); anything
 * else is logged as refused and answers 404, so a referral she may not see and one that does
 * not exist look the same.
 */
export async function visibleReferral(
	caller: Caller,
	id: string,
	action: AuditAction,
	may: (actor: Caller['actor'], row: ReferralRow) => boolean = mayReadReferral
): Promise<ReferralRow> {
	const row = await referralRow(id);
	if (!row || !may(caller.actor, row)) {
		return refuse(caller, action, notFound(), { type: 'referral', id }, row?.clientId);
	}
	return row;
}
