import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	createScratchDatabase,
	type ScratchDatabase
} from '../../../../../tests/support/scratch-database';
import { reviewQuery } from './filters';
import { eventsQuery } from './service';

// Every filter the review offers answers from an index on the log, never a sequential scan
// of it. A scratch database gets 200,000 invented rows (the indexes were chosen on a 1 M-row
// log; the planner makes the same choices here), then each filter's page query is EXPLAINed.

let s: ScratchDatabase;
let ids: { studio: string; clinic: string; actor: string; client: string; referral: string };

beforeAll(async () => {
	s = await createScratchDatabase('plans');
	ids = await s.asSuperuser(async (c) => {
		await c.query(`
			insert into organisations (name, kind)
				select 'Studio ' || g, 'studio'::organisation_kind from generate_series(1, 5) g
				union all select 'Clinic ' || g, 'clinic'::organisation_kind from generate_series(1, 5) g;
			insert into users (email, name) select 'u' || g || '@plan.example', 'User ' || g from generate_series(1, 100) g;
			insert into clients (organisation_id, name, stage, birth_date)
				select (array(select id from organisations where kind = 'studio' order by name))[1 + g % 5],
					'Client ' || g, 'postpartum', current_date - 60
				from generate_series(1, 2000) g;
			insert into referrals (client_id, studio_id, clinic_id, reason, urgency, red_flags, state, sent_at)
				select c.id, c.organisation_id,
					(array(select id from organisations where kind = 'clinic' order by name))[1 + abs(hashtext(c.id::text)) % 5],
					'r', 'routine', '{}', 'sent', now()
				from clients c where c.name like '%0';
			insert into subject_keys (client_id) select id from clients;
			create temp table a as select
				array(select id from users order by id) as u,
				array(select id from organisations order by id) as o,
				array(select c.id from clients c order by c.id) as c,
				array(select k.key from clients c join subject_keys k on k.client_id = c.id order by c.id) as k,
				array(select id from referrals order by id) as r;
			insert into access_log (at, actor_user_id, actor_role, actor_organisation_id, action,
				target_type, target_id, subject_key, outcome, client_address)
			select now() - g * interval '30 second', a.u[1 + g % 100], 'instructor', a.o[1 + g % 10],
				(array['client.read','client.listed','screening.read','referral.read','document.downloaded','signin.succeeded','client.updated','access.denied'])[1 + g % 8],
				case g % 3 when 0 then 'client' when 1 then 'referral' end,
				case g % 3 when 0 then a.c[1 + g % 2000]::text when 1 then a.r[1 + g % cardinality(a.r)]::text end,
				case when g % 3 <> 2 then a.k[1 + g % 2000] end,
				case when g % 50 = 0 then 'refused' else 'success' end, '192.0.2.' || g % 250
			from generate_series(1, 200000) g, a;
			analyze;`);
		const one = async (q: string) => (await c.query(q)).rows[0].id as string;
		const studio = await one(
			`select id from organisations where kind = 'studio' order by name limit 1`
		);
		return {
			studio,
			clinic: await one(`select id from organisations where kind = 'clinic' order by name limit 1`),
			actor: await one(
				`select actor_user_id as id from access_log where actor_organisation_id = '${studio}' limit 1`
			),
			client: await one(`select id from clients where organisation_id = '${studio}' limit 1`),
			referral: await one(`select id from referrals where studio_id = '${studio}' limit 1`)
		};
	});
}, 180_000);
afterAll(() => s?.drop());

const day = (offset: number) =>
	new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

const FILTERS: Array<[string, () => Record<string, string>, string | null]> = [
	['no filter', () => ({}), null],
	['person', () => ({ actor: ids.actor }), 'access_log_actor_at_idx'],
	['client', () => ({ client: ids.client }), 'access_log_subject_at_idx'],
	['action', () => ({ action: 'document.downloaded' }), null],
	['outcome', () => ({ outcome: 'refused' }), null],
	['record', () => ({ target: `referral:${ids.referral}` }), 'access_log_target_at_idx'],
	['date range', () => ({ from: day(-2), to: day(-1) }), null],
	['action and outcome', () => ({ action: 'client.read', outcome: 'refused' }), null],
	['person and dates', () => ({ actor: ids.actor, from: day(-10), to: day(0) }), null],
	['client and action', () => ({ client: ids.client, action: 'client.read' }), null]
];

describe('query plans on a large log', () => {
	it.each(FILTERS)('%s: no sequential scan on the log', async (_name, input, index) => {
		for (const kind of ['studio', 'clinic'] as const) {
			const reviewer = {
				organisationId: kind === 'studio' ? ids.studio : ids.clinic,
				organisationName: kind,
				kind
			};
			const query = reviewQuery.parse({ limit: '50', ...input() });
			const plan = await s.app.execute<{ 'QUERY PLAN': string }>(
				sql`explain ${eventsQuery(reviewer, query, null, 51)}`
			);
			const text = plan.rows.map((r) => r['QUERY PLAN']).join('\n');
			expect(text, text).not.toMatch(/Seq Scan on access_log/);
			expect(text, text).toMatch(/(Index|Bitmap Index) Scan[^\n]* on access_log/);
			if (index && kind === 'studio') expect(text, text).toContain(index);
		}
	});
});
