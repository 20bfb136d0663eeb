import { and, inArray, isNotNull } from 'drizzle-orm';
import type { Database } from '../db';
import { documents, referrals } from '../db/schema';
import { deleteObject, listObjects } from '../storage';
import { startLoop, type Loop } from '../loop';

// Removes stored objects that no row accounts for. An upload writes its object before its
// row, and a referral's letter is written inside the send's transaction, so for a moment an
// object may lack its row; one whose row failed (and whose cleanup failed too), or whose
// referral was later deleted, lacks it for good. Only objects older than the grace period
// are removed, so an upload in flight is never touched. Background work: it asserts no
// caller's policy and touches no client's data, so it writes no access-log row.

export const DOCUMENTS_PREFIX = 'documents/';
export const LETTERS_PREFIX = 'referral-letters/';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

export interface SweepOptions {
	/** Objects younger than this are left alone (default one hour). */
	graceMs?: number;
	now?: Date;
}

/** Deletes orphaned document and letter objects; returns the keys it deleted. */
export async function sweepOrphans(
	database: Database,
	options: SweepOptions = {}
): Promise<string[]> {
	const graceMs = options.graceMs ?? 60 * 60 * 1000;
	const cutoff = (options.now ?? new Date()).getTime() - graceMs;
	const old = (objects: Awaited<ReturnType<typeof listObjects>>) =>
		objects.filter((o) => o.lastModified === null || o.lastModified.getTime() <= cutoff);

	const orphans: string[] = [];
	const storedDocuments = old(await listObjects(DOCUMENTS_PREFIX)).map((o) => o.key);
	for (let i = 0; i < storedDocuments.length; i += 500) {
		const batch = storedDocuments.slice(i, i + 500);
		const rows = await database
			.select({ key: documents.storageKey })
			.from(documents)
			.where(inArray(documents.storageKey, batch));
		const known = new Set(rows.map((r) => r.key));
		orphans.push(...batch.filter((key) => !known.has(key)));
	}

	// referral-letters/<referral id>.pdf belongs to a referral that was sent.
	const letters = old(await listObjects(LETTERS_PREFIX)).map((o) => ({
		key: o.key,
		id: o.key.slice(LETTERS_PREFIX.length, -'.pdf'.length)
	}));
	for (let i = 0; i < letters.length; i += 500) {
		const batch = letters.slice(i, i + 500);
		const ids = batch.map((l) => l.id).filter((id) => UUID.test(id));
		const rows = ids.length
			? await database
					.select({ id: referrals.id })
					.from(referrals)
					.where(and(inArray(referrals.id, ids), isNotNull(referrals.sentAt)))
			: [];
		const sent = new Set(rows.map((r) => r.id));
		orphans.push(...batch.filter((l) => !sent.has(l.id)).map((l) => l.key));
	}

	for (const key of orphans) await deleteObject(key);
	return orphans;
}

/**
 * Runs `sweepOrphans` every `intervalMs` (default 15 min) until stopped. Storage or the
 * database being down is logged once per outage and retried next time; it never throws.
 */
export function startDocumentSweeper(
	database: Database,
	options: SweepOptions & { intervalMs?: number; log?: (line: string) => void } = {}
): Loop {
	const intervalMs = options.intervalMs ?? 15 * 60 * 1000;
	const log = options.log ?? ((line: string) => console.error(line));
	return startLoop({
		name: '[documents] sweeper',
		everyMs: intervalMs,
		firstInMs: Math.min(intervalMs, 60_000),
		recovered: 'storage and database reachable again',
		log,
		run: async () => {
			const deleted = await sweepOrphans(database, { graceMs: options.graceMs });
			if (deleted.length > 0) log(`[documents] sweeper removed ${deleted.length} orphan(s)`);
		}
	});
}
