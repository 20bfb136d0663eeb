import { and, desc, eq } from 'drizzle-orm';
import {
	anyConsentCovers,
	consentCovers,
	consentStatus,
	sharingEndedAt,
	type ConsentStatus,
	type ShareScope
} from '../../domain/consent';
import type { Executor } from '../db';
import { readOnce } from '../db/scope';
import { consents } from '../db/schema';

// Reading grants for other services' policy checks (referrals now; clearances and documents
// later). Not a caller-facing service: the calling service has already asserted its own
// policy and passes its transaction, so consent is read fresh, inside the same work.

export type ConsentRow = typeof consents.$inferSelect;

export interface SharingPair {
	/** Null for a referral the studio erased: no grant remains, nothing is shared any more. */
	clientId: string | null;
	studioId: string;
	clinicId: string;
}

/** A pair whose client record exists (every pair but an erased referral's). */
export type HeldPair = SharingPair & { clientId: string };

/** Every grant between this client's studio and this clinic, newest first. */
export async function grantsBetween(
	executor: Executor,
	pair: SharingPair,
	options: { lock?: boolean } = {}
): Promise<ConsentRow[]> {
	if (pair.clientId === null) return [];
	const query = executor
		.select()
		.from(consents)
		.where(
			and(
				eq(consents.clientId, pair.clientId),
				eq(consents.studioId, pair.studioId),
				eq(consents.clinicId, pair.clinicId)
			)
		)
		.orderBy(desc(consents.startsAt));
	// FOR SHARE holds the grants until the caller's transaction ends: a withdrawal (an UPDATE)
	// waits for it, and a move that waited behind a withdrawal reads the withdrawn row.
	if (options.lock) return query.for('share');
	// A page's services each check the same pair: one read per page load.
	return readOnce(`grants:${pair.clientId}:${pair.studioId}:${pair.clinicId}`, async () => query);
}

export interface SharingState {
	/** True when one grant in force covers every scope asked for. */
	covered: boolean;
	/** The grant that covers them (the newest such), for the record of what allowed a send. */
	grant: ConsentRow | null;
	/** Where the newest grant stands; 'none' when she never gave one. */
	status: ConsentStatus | 'none';
	/** When sharing under the newest grant ended, or null while it holds (or never began). */
	endedAt: Date | null;
}

/** Whether sharing between the pair is allowed for `scopes` right now. */
export async function sharingState(
	executor: Executor,
	pair: SharingPair,
	scopes: readonly ShareScope[],
	now = new Date(),
	options: { lock?: boolean } = {}
): Promise<SharingState> {
	const grants = await grantsBetween(executor, pair, options);
	const newest = grants[0] ?? null;
	const grant = grants.find((g) => consentCovers(g, scopes, now)) ?? null;
	return {
		covered: anyConsentCovers(grants, scopes, now),
		grant,
		status: newest ? consentStatus(newest, now) : 'none',
		endedAt: newest ? sharingEndedAt(newest, now) : null
	};
}
