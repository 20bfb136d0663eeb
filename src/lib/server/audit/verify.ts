import { sql } from 'drizzle-orm';
import type { Database } from '../db';
import { anchorHead, listAnchors, readAnchor, type AnchorStore } from './anchors';
import { chainColumns, GENESIS_HASH, linkHash, toChainRow } from './chain';

// Walks the seal chain in row order and names the first link that does not hold.

export type BrokenLinkProblem =
	/** The row's content no longer hashes to its seal: it was altered (or rows were swapped). */
	| 'row-altered'
	/** A seal names a row that is gone: the row was deleted. */
	| 'row-missing'
	/** A row below the chain's head has no seal: a seal was removed, or the row was slipped in. */
	| 'seal-missing'
	/** A seal's previous hash is not the hash before it: seals were removed, reordered or forged. */
	| 'chain-broken'
	/** The chain no longer passes through a head anchored outside the database: re-sealed. */
	| 'anchor-mismatch'
	/** A head was anchored beyond the chain's end: the newest rows and their seals were cut. */
	| 'rows-missing';

export interface BrokenLink {
	rowId: number;
	problem: BrokenLinkProblem;
	detail: string;
}

/** A head anchored outside the database (./anchors.ts), as its key names it. */
export interface AnchoredHead {
	rowId: number;
	hash: string;
	/** When it was anchored, for the report (read from the anchor itself where known). */
	anchoredAt?: string;
}

export interface VerifyReport {
	/** True when the chain holds and no row waited more than `staleAfterMs` for its seal. */
	ok: boolean;
	intact: boolean;
	rows: number;
	sealed: number;
	headRowId: number | null;
	headHash: string | null;
	/** Anchored heads checked against the chain. */
	anchoredHeads: number;
	/** The newest anchored head, if any. */
	latestAnchor: AnchoredHead | null;
	firstBroken: BrokenLink | null;
	/** Rows after the head still unsealed after `staleAfterMs` (is the sealer running?). */
	staleUnsealed: { count: number; oldestRowId: number | null; oldestAt: Date | null };
	/** Links checked before the walk ended (all of them when intact). */
	checked: number;
	/** Links walked per second (the walk alone). */
	rowsPerSecond: number;
	elapsedMs: number;
}

export interface VerifyOptions {
	staleAfterMs?: number;
	batchSize?: number;
	/** Heads anchored outside the database; the chain must pass through every one. */
	anchors?: AnchoredHead[];
}

type Seal = { row_id: string; prev_hash: string; hash: string };

/**
 * Reads one consistent snapshot of the log and its seals (REPEATABLE READ, read only) and
 * walks it in batches of `batchSize` ids, each batch read through the primary keys, so
 * memory stays flat however long the log is.
 */
export async function verifyChain(
	database: Database,
	options: VerifyOptions = {}
): Promise<VerifyReport> {
	const staleAfterMs = options.staleAfterMs ?? 60_000;
	const batchSize = options.batchSize ?? 2000;
	const anchors = [...(options.anchors ?? [])].sort((a, b) => a.rowId - b.rowId);

	return database.transaction(
		async (tx) => {
			const head = await tx.execute<{
				head: string | null;
				hash: string | null;
				sealed: string;
				rows: string;
			}>(sql`
				select h.row_id::text as head, h.hash,
					(select count(*) from access_log_seals)::text as sealed,
					(select count(*) from access_log)::text as rows
				from (select 1) one
				left join lateral (
					select row_id, hash from access_log_seals order by row_id desc limit 1
				) h on true`);
			const headRowId = head.rows[0]?.head ? Number(head.rows[0].head) : null;
			const report: VerifyReport = {
				ok: true,
				intact: true,
				rows: Number(head.rows[0]?.rows ?? 0),
				sealed: Number(head.rows[0]?.sealed ?? 0),
				headRowId,
				headHash: head.rows[0]?.hash ?? null,
				anchoredHeads: anchors.length,
				latestAnchor: anchors.at(-1) ?? null,
				firstBroken: null,
				staleUnsealed: { count: 0, oldestRowId: null, oldestAt: null },
				checked: 0,
				rowsPerSecond: 0,
				elapsedMs: 0
			};

			const started = performance.now();
			let walked = 0;
			let prevHash = GENESIS_HASH;
			let after = 0;
			let nextAnchor = 0;
			let lastMatchingAnchor: AnchoredHead | null = null;
			const broken = (rowId: number, problem: BrokenLinkProblem, detail: string) => {
				report.firstBroken = { rowId, problem, detail };
			};

			walk: while (headRowId !== null && after < headRowId) {
				// The next batch of seals, then every row in the same id range.
				const seals = await tx.execute<Seal>(sql`
					select s.row_id::text as row_id, s.prev_hash, s.hash from access_log_seals s
					where s.row_id > ${after} and s.row_id <= ${headRowId}
					order by s.row_id limit ${batchSize}`);
				const upper =
					seals.rows.length === batchSize ? Number(seals.rows.at(-1)!.row_id) : headRowId;
				const rows = await tx.execute<Record<string, unknown>>(sql`
					select ${chainColumns} from access_log l
					where l.id > ${after} and l.id <= ${upper} order by l.id`);
				let si = 0;
				let ri = 0;
				while (si < seals.rows.length || ri < rows.rows.length) {
					const seal = seals.rows[si];
					const raw = rows.rows[ri];
					const sealId = seal ? Number(seal.row_id) : Infinity;
					const rawId = raw ? Number(raw.id) : Infinity;
					const rowId = Math.min(sealId, rawId);
					if (sealId === rowId) si++;
					if (rawId === rowId) ri++;
					if (sealId !== rowId) {
						broken(
							rowId,
							'seal-missing',
							`row ${rowId} lies below the chain's head but has no seal`
						);
						break walk;
					}
					if (seal!.prev_hash !== prevHash) {
						broken(
							rowId,
							'chain-broken',
							`the seal of row ${rowId} chains from ${seal!.prev_hash.slice(0, 12)}…, ` +
								`the link before it ends in ${prevHash.slice(0, 12)}…`
						);
						break walk;
					}
					if (rawId !== rowId) {
						broken(rowId, 'row-missing', `row ${rowId} was sealed but is no longer in the log`);
						break walk;
					}
					const expected = linkHash(prevHash, toChainRow(raw!));
					if (expected !== seal!.hash) {
						broken(
							rowId,
							'row-altered',
							`row ${rowId} no longer matches the hash it was sealed with`
						);
						break walk;
					}
					// Every head anchored at this row must be this very link.
					while (nextAnchor < anchors.length && anchors[nextAnchor]!.rowId <= rowId) {
						const anchor = anchors[nextAnchor++]!;
						if (anchor.rowId === rowId && anchor.hash !== expected) {
							broken(
								rowId,
								'anchor-mismatch',
								`row ${rowId}'s link no longer matches the head anchored` +
									`${anchor.anchoredAt ? ` at ${anchor.anchoredAt}` : ''}: the chain was rewritten and re-sealed ` +
									(lastMatchingAnchor
										? `after row ${lastMatchingAnchor.rowId} (the last anchored head that still matches)`
										: 'at or before this row')
							);
							break walk;
						}
						if (anchor.rowId < rowId) {
							broken(
								anchor.rowId,
								'anchor-mismatch',
								`row ${anchor.rowId} was anchored as a head but is no longer on the chain: ` +
									'rows were removed and the chain re-sealed'
							);
							break walk;
						}
						lastMatchingAnchor = anchor;
					}
					prevHash = expected;
					walked++;
				}
				after = upper;
			}

			if (!report.firstBroken) {
				// Heads anchored beyond the end of the chain: its tail was cut.
				const beyond = anchors.slice(nextAnchor);
				const missing = beyond.at(-1);
				if (missing) {
					const last = headRowId ?? 0;
					broken(
						beyond[0]!.rowId > last + 1 ? last + 1 : beyond[0]!.rowId,
						'rows-missing',
						`rows after #${last} are missing; anchored head at #${missing.rowId}` +
							(missing.anchoredAt ? ` (anchored ${missing.anchoredAt})` : '')
					);
				}
			}
			report.checked = walked;
			report.elapsedMs = Math.round(performance.now() - started);
			report.rowsPerSecond = Math.round(walked / Math.max(report.elapsedMs / 1000, 0.001));

			const stale = await tx.execute<{ count: string; oldest: string | null; at: Date | null }>(sql`
				select count(*)::text as count, min(id)::text as oldest, min(at) as at
				from access_log
				where id > ${headRowId ?? 0}
					and at < clock_timestamp() - make_interval(secs => ${staleAfterMs / 1000})`);
			const st = stale.rows[0];
			report.staleUnsealed = {
				count: Number(st?.count ?? 0),
				oldestRowId: st?.oldest ? Number(st.oldest) : null,
				oldestAt: st?.at ? new Date(st.at) : null
			};
			report.intact = report.firstBroken === null;
			report.ok = report.intact && report.staleUnsealed.count === 0;
			return report;
		},
		{ isolationLevel: 'repeatable read', accessMode: 'read only' }
	);
}

/**
 * Anchors the current head (so every verification also extends the anchors), then checks
 * the chain and every head ever anchored for this database.
 */
export async function verifyAnchored(
	database: Database,
	store: AnchorStore,
	options: Omit<VerifyOptions, 'anchors'> = {}
): Promise<VerifyReport> {
	await anchorHead(database, store);
	const listed = await listAnchors(database, store);
	const latest = listed.at(-1);
	const latestBody = latest ? await readAnchor(store, latest.key) : null;
	const anchors: AnchoredHead[] = listed.map((a) => ({
		rowId: a.rowId,
		hash: a.hash,
		...(a === latest && latestBody ? { anchoredAt: latestBody.anchoredAt } : {})
	}));
	return verifyChain(database, { ...options, anchors });
}

export function describeReport(report: VerifyReport): string {
	const lines: string[] = [];
	if (report.firstBroken) {
		const b = report.firstBroken;
		lines.push(`BROKEN at row ${b.rowId} (${b.problem}): ${b.detail}`);
	} else {
		lines.push(
			`intact: ${report.sealed} link(s) verified` +
				(report.headRowId === null ? ' (nothing sealed yet)' : ` up to row ${report.headRowId}`)
		);
	}
	const latest = report.latestAnchor;
	lines.push(
		`${report.anchoredHeads} anchored head(s) checked` +
			(latest
				? `, the newest at row ${latest.rowId}${latest.anchoredAt ? ` (${latest.anchoredAt})` : ''}`
				: '') +
			`; ${report.rowsPerSecond} rows/s`
	);
	lines.push(`${report.rows} row(s) in the log, ${report.sealed} sealed`);
	const st = report.staleUnsealed;
	if (st.count > 0) {
		lines.push(
			`${st.count} row(s) unsealed for more than a minute, from row ${st.oldestRowId}` +
				` (${st.oldestAt?.toISOString()}): is the sealer running?`
		);
	}
	return lines.join('\n');
}
