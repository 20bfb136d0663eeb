import { and, eq, isNull } from 'drizzle-orm';
import { sharingState, type HeldPair } from '../consents/grants';
import type { Executor } from '../db';
import { clearances } from '../db/schema';

// When a client withdraws sharing, the studio keeps the clearances it already received — the
// safest information it has, still used by the plan check — labelled with the day sharing
// ended. Called by the consents service inside the withdrawal's transaction (after it asserted
// its own policy: only the client herself withdraws), so it asserts none of its own.

/** Stamps the pair's clearances once no grant in force shares clearances any longer. */
export async function markClearancesSharingEnded(
	tx: Executor,
	pair: HeldPair,
	now: Date
): Promise<number> {
	if ((await sharingState(tx, pair, ['clearance'], now)).covered) return 0;
	const stamped = await tx
		.update(clearances)
		.set({ sharingEndedOn: now.toISOString().slice(0, 10) })
		.where(
			and(
				eq(clearances.clientId, pair.clientId),
				eq(clearances.clinicId, pair.clinicId),
				isNull(clearances.sharingEndedOn)
			)
		)
		.returning({ id: clearances.id });
	return stamped.length;
}
