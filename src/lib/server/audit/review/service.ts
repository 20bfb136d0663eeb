import { sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { actionLabel } from '../../../audit-labels';
import { refuse, type Caller } from '../../context';
import { db, type Executor } from '../../db';
import { notFound } from '../../http/problem';
import { decodeCursor, encodeCursor, type Page } from '../../http/schemas';
import { recordAccess } from '../writer';
import { verifyAnchored } from '../verify';
import { s3AnchorStore } from '../../storage/anchors';
import { summariseWeeks, summaryStart, type DailyCount, type MemberActivity } from './summary';
import { csvLines } from './csv';
import { filterOf, timeRange, type ReviewQuery } from './filters';
import { reviewerOf, type Reviewer } from './policy';
import { holdsClient, inScope } from './scope';

// The admin's review of the access log. Every exported function asserts `reviewerOf` (an
// admin of the organisation she acts in) and reads only events in that organisation's
// scope (./scope.ts). Reads are logged as `audit.read`, exports as `audit.exported`.

export interface AccessEventItem {
	id: number;
	at: string;
	actor: {
		id: string | null;
		name: string | null;
		role: string | null;
		organisationId: string | null;
		organisationName: string | null;
	};
	action: string;
	label: string;
	target: { type: string; id: string } | null;
	/**
	 * Whose data: null when the event touched no client; her id and name where the
	 * reviewer's organisation holds her; both null for a client of another organisation
	 * (`erased` when the client's key was erased).
	 */
	client: { id: string | null; name: string | null; erased?: boolean } | null;
	outcome: string;
	address: string | null;
}

const cursorSchema = z.object({ at: z.number().int(), id: z.number().int().positive() });
type Cursor = z.infer<typeof cursorSchema>;

/** Her scope, or a logged refusal answered as 404. */
async function assertReviewer(
	caller: Caller,
	action: 'audit.read' | 'audit.exported' | 'audit.verified'
) {
	const reviewer = reviewerOf(caller.actor);
	if (!reviewer) return refuse(caller, action, notFound());
	return reviewer;
}

const asReviewer = (caller: Caller, reviewer: Reviewer) => ({
	...caller.access,
	role: 'admin',
	organisationId: reviewer.organisationId
});

/** A client filter must name a client her organisation holds: else 404, logged. */
async function assertClientInScope(
	caller: Caller,
	reviewer: Reviewer,
	q: ReviewQuery,
	action: 'audit.read' | 'audit.exported'
) {
	if (!q.client) return;
	const found = await db().execute<{ ok: boolean }>(
		sql`select ${holdsClient(reviewer, sql`${q.client}::uuid`)} as ok`
	);
	if (!found.rows[0]?.ok) {
		await refuse(caller, action, notFound(), { type: 'client', id: q.client }, q.client);
	}
}

function filters(q: ReviewQuery, after: Cursor | null): SQL[] {
	const where: SQL[] = [];
	if (q.actor) where.push(sql`l.actor_user_id = ${q.actor}`);
	if (q.client) {
		where.push(
			sql`l.subject_key = (select k.key from subject_keys k where k.client_id = ${q.client})`
		);
	}
	if (q.action) where.push(sql`l.action = ${q.action}`);
	if (q.outcome) where.push(sql`l.outcome = ${q.outcome}`);
	if (q.target) {
		const split = q.target.indexOf(':');
		where.push(
			sql`l.target_type = ${q.target.slice(0, split)} and l.target_id = ${q.target.slice(split + 1)}`
		);
	}
	const range = timeRange(q);
	if (range.from) where.push(sql`l.at >= ${range.from.toISOString()}::timestamptz`);
	if (range.before) where.push(sql`l.at < ${range.before.toISOString()}::timestamptz`);
	if (after) {
		where.push(sql`(l.at, l.id) < (${new Date(after.at).toISOString()}::timestamptz, ${after.id})`);
	}
	return where;
}

/** The SQL of one page of events in her scope, newest first (exported for the plan tests). */
export function eventsQuery(
	reviewer: Reviewer,
	q: ReviewQuery,
	after: Cursor | null,
	limit: number,
	extra: SQL[] = []
): SQL {
	const where = sql.join([inScope(reviewer), ...filters(q, after), ...extra], sql` and `);
	return sql`
		with page as materialized (
			select l.id, l.at, l.actor_user_id, l.actor_role, l.actor_organisation_id, l.action,
				l.target_type, l.target_id, l.subject_key, l.outcome, l.client_address
			from access_log l
			where ${where}
			order by l.at desc, l.id desc
			limit ${limit}
		)
		select p.id::text as id, (extract(epoch from p.at) * 1000)::bigint::text as at_ms,
			p.actor_user_id::text as actor_id, u.name as actor_name, p.actor_role,
			p.actor_organisation_id::text as actor_org_id, o.name as actor_org_name,
			p.action, p.target_type, p.target_id, p.outcome, p.client_address,
			p.subject_key is not null as has_subject, k.key is null as erased,
			hc.id::text as client_id, hc.name as client_name
		from page p
		left join users u on u.id = p.actor_user_id
		left join organisations o on o.id = p.actor_organisation_id
		left join subject_keys k on k.key = p.subject_key
		left join clients hc on hc.id = k.client_id and ${holdsClient(reviewer, sql`hc.id`)}
		order by p.at desc, p.id desc`;
}

type EventRow = Record<string, string | boolean | null>;

function toItem(r: EventRow): AccessEventItem {
	const s = (v: string | boolean | null | undefined) => (v == null ? null : String(v));
	return {
		id: Number(r.id),
		at: new Date(Number(r.at_ms)).toISOString(),
		actor: {
			id: s(r.actor_id),
			name: s(r.actor_name),
			role: s(r.actor_role),
			organisationId: s(r.actor_org_id),
			organisationName: s(r.actor_org_name)
		},
		action: String(r.action),
		label: actionLabel(String(r.action)),
		target: r.target_type ? { type: String(r.target_type), id: String(r.target_id) } : null,
		client: r.has_subject
			? {
					id: s(r.client_id),
					name: s(r.client_name),
					...(r.erased ? { erased: true } : {})
				}
			: null,
		outcome: String(r.outcome),
		address: s(r.client_address)
	};
}

async function fetchEvents(
	executor: Executor,
	reviewer: Reviewer,
	q: ReviewQuery,
	after: Cursor | null,
	limit: number
): Promise<AccessEventItem[]> {
	const result = await executor.execute<EventRow>(eventsQuery(reviewer, q, after, limit));
	return result.rows.map(toItem);
}

const cursorOf = (item: AccessEventItem): Cursor => ({ at: Date.parse(item.at), id: item.id });

/** Policy: admin of the active organisation, her scope only. Audit: audit.read. */
export async function listAccessEvents(
	caller: Caller,
	q: ReviewQuery
): Promise<Page<AccessEventItem>> {
	const reviewer = await assertReviewer(caller, 'audit.read');
	const after = decodeCursor(q.cursor, cursorSchema);
	await assertClientInScope(caller, reviewer, q, 'audit.read');
	return db().transaction(async (tx) => {
		const rows = await fetchEvents(tx, reviewer, q, after, q.limit + 1);
		await recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.read',
			outcome: 'success',
			target: { type: 'organisation', id: reviewer.organisationId },
			clientId: q.client ?? null
		});
		const items = rows.slice(0, q.limit);
		const last = items.at(-1);
		return {
			items,
			nextCursor: rows.length > q.limit && last ? encodeCursor(cursorOf(last)) : null
		};
	});
}

/** Policy: admin of the active organisation; an event outside her scope is 404 (logged). Audit: audit.read. */
export async function getAccessEvent(caller: Caller, id: number): Promise<AccessEventItem> {
	const reviewer = await assertReviewer(caller, 'audit.read');
	const target = { type: 'access_event', id: String(id) };
	return db().transaction(async (tx) => {
		const result = await tx.execute<EventRow>(
			eventsQuery(reviewer, { limit: 1 }, null, 1, [sql`l.id = ${id}`])
		);
		const row = result.rows[0];
		if (!row) return refuse(caller, 'audit.read', notFound(), target);
		await recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.read',
			outcome: 'success',
			target
		});
		return toItem(row);
	});
}

// ---------------------------------------------------------------- export

export const CSV_HEADER = [
	'id',
	'at',
	'actor_id',
	'actor_name',
	'actor_role',
	'actor_organisation',
	'action',
	'action_label',
	'target_type',
	'target_id',
	'client',
	'outcome',
	'address'
];

export function csvRow(item: AccessEventItem): Array<string | null> {
	return [
		String(item.id),
		item.at,
		item.actor.id,
		item.actor.name,
		item.actor.role,
		item.actor.organisationName,
		item.action,
		item.label,
		item.target?.type ?? null,
		item.target?.id ?? null,
		clientWords(item.client),
		item.outcome,
		item.address
	];
}

/** Whose data, in words (the screen and the export say the same). */
export function clientWords(client: AccessEventItem['client']): string {
	if (!client) return '';
	if (client.name) return client.name;
	return client.erased ? 'an erased client record' : 'a client of another organisation';
}

export interface AccessLogExport {
	filename: string;
	stream: ReadableStream<Uint8Array>;
}

export interface ExportOptions {
	batchSize?: number;
	/** Test seam: told before each batch is queried (1, 2, …). */
	onBatch?: (n: number) => void;
}

const slug = (s: string) =>
	s
		.toLowerCase()
		.replace(/[^a-z0-9]+/g, '-')
		.replace(/^-|-$/g, '')
		.slice(0, 60) || 'organisation';

/** The export's file name: the organisation and the range. */
export function exportFilename(organisationName: string, q: ReviewQuery, today = new Date()) {
	const day = (s: string | undefined, fallback: string) => (s ? s.slice(0, 10) : fallback);
	return `access-log_${slug(organisationName)}_${day(q.from, 'start')}_to_${day(q.to, today.toISOString().slice(0, 10))}.csv`;
}

/** The filter as recorded with the export: ids and codes only, the client as her key. */
function recordedFilter(q: ReviewQuery): string {
	const f = filterOf(q);
	if (f.client) f.client = '(subject key)';
	return new URLSearchParams(f).toString() || '(all)';
}

/**
 * Policy: admin of the active organisation, her scope only. Audit: one audit.exported row
 * with the filter, committed before the first byte. The rows stream in keyset batches,
 * queried only as the reader asks for more: the whole result is never in memory.
 */
export async function exportAccessEvents(
	caller: Caller,
	q: ReviewQuery,
	options: ExportOptions = {}
): Promise<AccessLogExport> {
	const reviewer = await assertReviewer(caller, 'audit.exported');
	await assertClientInScope(caller, reviewer, q, 'audit.exported');
	const batchSize = options.batchSize ?? 1000;
	await db().transaction((tx) =>
		recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.exported',
			outcome: 'success',
			target: { type: 'audit_filter', id: recordedFilter(q) },
			clientId: q.client ?? null
		})
	);
	const encoder = new TextEncoder();
	let after: Cursor | null = null;
	let batches = 0;
	let headerSent = false;
	const stream = new ReadableStream<Uint8Array>(
		{
			async pull(controller) {
				if (!headerSent) {
					headerSent = true;
					controller.enqueue(encoder.encode(csvLines([CSV_HEADER])));
					return;
				}
				options.onBatch?.(++batches);
				const items = await fetchEvents(db(), reviewer, q, after, batchSize);
				if (items.length > 0) controller.enqueue(encoder.encode(csvLines(items.map(csvRow))));
				if (items.length < batchSize) controller.close();
				else after = cursorOf(items.at(-1)!);
			}
		},
		{ highWaterMark: 0 }
	);
	return { filename: exportFilename(reviewer.organisationName, q), stream };
}

// ---------------------------------------------------------------- verify

export interface VerifyAnswer {
	ok: boolean;
	checkedRows: number;
	headRowId: number | null;
	headHash: string | null;
	anchoredHeads: number;
	/** When the newest anchored head was written. */
	anchoredAt: string | null;
	rowsPerSecond: number;
	firstBrokenRowId?: number;
	detail?: string;
}

/**
 * Policy: admin of the active organisation (the chain is one for all; the answer names rows
 * by number only). Audit: audit.verified. Anchors the head, then checks the chain and every
 * anchored head.
 */
export async function verifyAccessLog(caller: Caller): Promise<VerifyAnswer> {
	const reviewer = await assertReviewer(caller, 'audit.verified');
	const report = await verifyAnchored(db(), s3AnchorStore);
	await db().transaction((tx) =>
		recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.verified',
			outcome: 'success',
			target: { type: 'organisation', id: reviewer.organisationId }
		})
	);
	return {
		ok: report.intact,
		checkedRows: report.checked,
		headRowId: report.headRowId,
		headHash: report.headHash,
		anchoredHeads: report.anchoredHeads,
		anchoredAt: report.latestAnchor?.anchoredAt ?? null,
		rowsPerSecond: report.rowsPerSecond,
		...(report.firstBroken
			? { firstBrokenRowId: report.firstBroken.rowId, detail: report.firstBroken.detail }
			: {})
	};
}

// ---------------------------------------------------------------- weekly summary

/**
 * Policy: admin of the active organisation; her members acting for it. Audit: audit.read.
 * One grouped query of daily counts, summarised by ./summary.ts.
 */
export async function summariseActivity(
	caller: Caller,
	weeks: number,
	today = new Date()
): Promise<{ weeks: number; members: MemberActivity[] }> {
	const reviewer = await assertReviewer(caller, 'audit.read');
	const day = today.toISOString().slice(0, 10);
	const start = summaryStart(day, weeks);
	return db().transaction(async (tx) => {
		const rows = await tx.execute<{
			user_id: string;
			name: string | null;
			day: string;
			action: string;
			outcome: string;
			n: string;
		}>(sql`
			select l.actor_user_id::text as user_id, u.name,
				to_char(l.at at time zone 'UTC', 'YYYY-MM-DD') as day, l.action, l.outcome,
				count(*)::text as n
			from access_log l
			left join users u on u.id = l.actor_user_id
			where l.actor_organisation_id = ${reviewer.organisationId}
				and l.actor_user_id is not null
				and l.at >= ${`${start}T00:00:00Z`}::timestamptz
			group by l.actor_user_id, u.name, 3, l.action, l.outcome`);
		await recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.read',
			outcome: 'success',
			target: { type: 'organisation', id: reviewer.organisationId }
		});
		const daily: DailyCount[] = rows.rows.map((r) => ({
			userId: r.user_id,
			name: r.name,
			day: r.day,
			action: r.action,
			outcome: r.outcome,
			count: Number(r.n)
		}));
		return { weeks, members: summariseWeeks(daily, day, weeks) };
	});
}
