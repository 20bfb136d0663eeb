import { sql } from 'drizzle-orm';
import type { Database } from '../db';
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
	| 'chain-broken';

export interface BrokenLink {
	rowId: number;
	problem: BrokenLinkProblem;
	detail: string;
}

export interface VerifyReport {
	/** True when the chain holds and no row waited more than `staleAfterMs` for its seal. */
	ok: boolean;
	intact: boolean;
	rows: number;
	sealed: number;
	headRowId: number | null;
	firstBroken: BrokenLink | null;
	/** Rows after the head still unsealed after `staleAfterMs` (is the sealer running?). */
	staleUnsealed: { count: number; oldestRowId: number | null; oldestAt: Date | null };
}

export interface VerifyOptions {
	staleAfterMs?: number;
	batchSize?: number;
}

/** Reads one consistent snapshot of the log and its seals (REPEATABLE READ, read only). */
export async function verifyChain(
	database: Database,
	options: VerifyOptions = {}
): Promise<VerifyReport> {
	const staleAfterMs = options.staleAfterMs ?? 60_000;
	const batchSize = options.batchSize ?? 2000;

	return database.transaction(
		async (tx) => {
			const head = await tx.execute<{ head: string | null; sealed: string; rows: string }>(sql`
				select (select max(row_id) from access_log_seals)::text as head,
					(select count(*) from access_log_seals)::text as sealed,
					(select count(*) from access_log)::text as rows`);
			const headRowId = head.rows[0]?.head ? Number(head.rows[0].head) : null;
			const report: VerifyReport = {
				ok: true,
				intact: true,
				rows: Number(head.rows[0]?.rows ?? 0),
				sealed: Number(head.rows[0]?.sealed ?? 0),
				headRowId,
				firstBroken: null,
				staleUnsealed: { count: 0, oldestRowId: null, oldestAt: null }
			};

			let prevHash = GENESIS_HASH;
			let after = 0;
			walk: while (headRowId !== null) {
				// Every id that has a row or a seal, up to the head, in order.
				const batch = await tx.execute<Record<string, unknown>>(sql`
					select coalesce(s.row_id, l.id)::text as key,
						s.row_id is not null as has_seal, l.id is not null as has_row,
						s.prev_hash, s.hash, ${chainColumns}
					from access_log_seals s
					full outer join access_log l on l.id = s.row_id
					where coalesce(s.row_id, l.id) > ${after} and coalesce(s.row_id, l.id) <= ${headRowId}
					order by coalesce(s.row_id, l.id)
					limit ${batchSize}`);
				for (const raw of batch.rows) {
					const rowId = Number(raw.key);
					after = rowId;
					const broken = (problem: BrokenLinkProblem, detail: string) => {
						report.firstBroken = { rowId, problem, detail };
					};
					if (!raw.has_seal) {
						broken('seal-missing', `row ${rowId} lies below the chain's head but has no seal`);
						break walk;
					}
					if (raw.prev_hash !== prevHash) {
						broken(
							'chain-broken',
							`the seal of row ${rowId} chains from ${String(raw.prev_hash).slice(0, 12)}…, ` +
								`the link before it ends in ${prevHash.slice(0, 12)}…`
						);
						break walk;
					}
					if (!raw.has_row) {
						broken('row-missing', `row ${rowId} was sealed but is no longer in the log`);
						break walk;
					}
					const expected = linkHash(prevHash, toChainRow(raw));
					if (expected !== raw.hash) {
						broken('row-altered', `row ${rowId} no longer matches the hash it was sealed with`);
						break walk;
					}
					prevHash = expected;
				}
				if (batch.rows.length < batchSize) break;
			}

			const stale = await tx.execute<{ count: string; oldest: string | null; at: Date | null }>(sql`
				select count(*)::text as count, min(id)::text as oldest, min(at) as at
				from access_log
				where id > ${headRowId ?? 0}
					and at < clock_timestamp() - make_interval(secs => ${staleAfterMs / 1000})`);
			const s = stale.rows[0];
			report.staleUnsealed = {
				count: Number(s?.count ?? 0),
				oldestRowId: s?.oldest ? Number(s.oldest) : null,
				oldestAt: s?.at ? new Date(s.at) : null
			};
			report.intact = report.firstBroken === null;
			report.ok = report.intact && report.staleUnsealed.count === 0;
			return report;
		},
		{ isolationLevel: 'repeatable read', accessMode: 'read only' }
	);
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
