import { sql } from 'drizzle-orm';
import type { Database } from '../db';
import { anchorHead, type AnchorStore } from './anchors';
import { chainColumns, GENESIS_HASH, linkHash, toChainRow } from './chain';
import { startLoop, type Loop } from '../loop';

// The sealer appends, for every access-log row in id order, one link (row id, previous hash,
// hash) to access_log_seals. Requests never wait for it: rows insert freely and the sealer
// follows a second or so behind. A transaction-scoped PostgreSQL advisory lock makes sure
// only one sealer works at a time, however many app processes run one; the seal table's
// primary key (row_id) would refuse a fork even if the lock were bypassed.
//
// Ids come from a sequence and can become visible out of order: a transaction that took id 7
// may commit after the one that took id 8, and a rolled-back transaction leaves a permanent
// hole. So the sealer stops at a hole in the ids until the row after the hole is older than
// `gapGraceMs` (default 10 s; request transactions are far shorter). A row that commits later
// than that can no longer be chained: the verifier reports it as a missing link.

/** Key of the advisory lock that elects the one sealer (any fixed bigint, ours alone). */
export const SEALER_LOCK_KEY = 5_338_870_214_421_001n;

export const DEFAULT_GAP_GRACE_MS = 10_000;

export interface SealOptions {
	/** How long a hole in the ids may hold back the rows after it (ms). */
	gapGraceMs?: number;
	/** Rows sealed per transaction. */
	batchSize?: number;
}

export interface SealResult {
	/** False when another sealer held the lock, so this one did nothing. */
	locked: boolean;
	sealed: number;
	/** The highest sealed row id after this run (null: nothing sealed yet). */
	headRowId: number | null;
}

/**
 * Seals what can be sealed now and returns. Safe to call from several connections or
 * processes at once: all but one return at once with `locked: false`.
 */
export async function sealPending(
	database: Database,
	options: SealOptions = {}
): Promise<SealResult> {
	const gapGraceMs = options.gapGraceMs ?? DEFAULT_GAP_GRACE_MS;
	const batchSize = options.batchSize ?? 500;
	let total = 0;
	let head: number | null = null;
	for (;;) {
		const batch = await sealBatch(database, gapGraceMs, batchSize);
		if (!batch.locked) return { locked: total > 0, sealed: total, headRowId: head };
		total += batch.sealed;
		head = batch.headRowId;
		if (!batch.more) return { locked: true, sealed: total, headRowId: head };
	}
}

async function sealBatch(database: Database, gapGraceMs: number, batchSize: number) {
	return database.transaction(async (tx) => {
		const lock = await tx.execute<{ locked: boolean }>(
			sql`select pg_try_advisory_xact_lock(${SEALER_LOCK_KEY.toString()}::bigint) as locked`
		);
		if (!lock.rows[0]?.locked) return { locked: false, sealed: 0, headRowId: null, more: false };

		// (Ordered by the bigint column, not by its text rendering: '9' sorts after '10'.)
		const last = await tx.execute<{ head: string; hash: string }>(
			sql`select s.row_id::text as head, s.hash from access_log_seals s order by s.row_id desc limit 1`
		);
		let headRowId = last.rows[0] ? Number(last.rows[0].head) : null;
		let prevHash = last.rows[0]?.hash ?? GENESIS_HASH;

		const pending = await tx.execute<Record<string, unknown>>(sql`
			select ${chainColumns},
				(extract(epoch from clock_timestamp() - l.at) * 1000)::float8 as age_ms
			from access_log l
			where l.id > ${headRowId ?? 0}
			order by l.id
			limit ${batchSize}`);

		const links: { rowId: number; prevHash: string; hash: string }[] = [];
		let expected = (headRowId ?? 0) + 1;
		for (const raw of pending.rows) {
			const row = toChainRow(raw);
			// A hole in the ids: a transaction may still commit the missing row. Wait for it
			// unless the row after the hole is old enough that the hole is surely final.
			if (row.id !== expected && Number(raw.age_ms) < gapGraceMs) break;
			const hash = linkHash(prevHash, row);
			links.push({ rowId: row.id, prevHash, hash });
			prevHash = hash;
			expected = row.id + 1;
			headRowId = row.id;
		}
		if (links.length > 0) {
			const values = sql.join(
				links.map((l) => sql`(${l.rowId}, ${l.prevHash}, ${l.hash})`),
				sql`, `
			);
			await tx.execute(
				sql`insert into access_log_seals (row_id, prev_hash, hash) values ${values}`
			);
		}
		return {
			locked: true,
			sealed: links.length,
			headRowId,
			more: links.length === batchSize
		};
	});
}

/** How often at most a moving head is anchored (so at least every half minute with new rows). */
export const DEFAULT_ANCHOR_EVERY_MS = 30_000;

/**
 * Runs `sealPending` every `intervalMs` (default 1 s) until stopped, and anchors the head in
 * `anchors` whenever it moved, at most every `anchorEveryMs`. A database or store that is
 * down is logged (once per outage) and retried on the next tick; it never throws.
 */
export function startSealer(
	database: Database,
	options: SealOptions & {
		intervalMs?: number;
		log?: (line: string) => void;
		anchors?: AnchorStore;
		anchorEveryMs?: number;
	} = {}
): Loop {
	const intervalMs = options.intervalMs ?? 1000;
	const anchorEveryMs = options.anchorEveryMs ?? DEFAULT_ANCHOR_EVERY_MS;
	let headMoved = false;
	let lastAnchorAt = 0;
	return startLoop({
		name: '[audit] sealer',
		everyMs: intervalMs,
		recovered: 'database reachable again',
		log: options.log,
		run: async () => {
			const result = await sealPending(database, options);
			if (result.sealed > 0) headMoved = true;
			if (options.anchors && headMoved && Date.now() - lastAnchorAt >= anchorEveryMs) {
				await anchorHead(database, options.anchors);
				headMoved = false;
				lastAnchorAt = Date.now();
			}
		}
	});
}
