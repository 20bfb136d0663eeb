import { sql } from 'drizzle-orm';
import type { Caller } from '../../context';
import { db } from '../../db';
import { recordAccess } from '../writer';
import { summariseWeeks, summaryStart, type DailyCount, type MemberActivity } from './summary';
import { asReviewer, assertReviewer } from './events';

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
