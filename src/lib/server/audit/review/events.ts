import { sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { actionLabel } from '../../../audit-labels';
import { refuse, type Caller } from '../../context';
import { db, type Executor } from '../../db';
import { notFound } from '../../http/problem';
import { timeRange, type ReviewQuery } from './filters';
import { reviewerOf, type Reviewer } from './policy';
import { holdsClient, inScope } from './scope';

// What every part of the admin's review shares: the event as she reads it, her scope check
// (a logged 404 for anyone else), the filters as SQL and one keyset page of events.

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

export const cursorSchema = z.object({ at: z.number().int(), id: z.number().int().positive() });
export type Cursor = z.infer<typeof cursorSchema>;

/** Her scope, or a logged refusal answered as 404. */
export async function assertReviewer(
	caller: Caller,
	action: 'audit.read' | 'audit.exported' | 'audit.verified'
) {
	const reviewer = reviewerOf(caller.actor);
	if (!reviewer) return refuse(caller, action, notFound());
	return reviewer;
}

export const asReviewer = (caller: Caller, reviewer: Reviewer) => ({
	...caller.access,
	role: 'admin',
	organisationId: reviewer.organisationId
});

/** A client filter must name a client her organisation holds: else 404, logged. */
export async function assertClientInScope(
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

export type EventRow = Record<string, string | boolean | null>;

export function toItem(r: EventRow): AccessEventItem {
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

export async function fetchEvents(
	executor: Executor,
	reviewer: Reviewer,
	q: ReviewQuery,
	after: Cursor | null,
	limit: number
): Promise<AccessEventItem[]> {
	const result = await executor.execute<EventRow>(eventsQuery(reviewer, q, after, limit));
	return result.rows.map(toItem);
}

export const cursorOf = (item: AccessEventItem): Cursor => ({
	at: Date.parse(item.at),
	id: item.id
});
