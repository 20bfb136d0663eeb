-- The benchmark's 1,000,000 access-log rows over the past year (`npm run bench`), inserted as
-- the app's role: only it may insert into the log (scale-data.sql makes everything else). Each
-- row is a member of the first bench studio on one bench client's record, so the bench
-- admin's whole log is these rows.
with keys as (
	select row_number() over (order by k.key) as n, k.key, k.client_id
	from subject_keys k join clients c on c.id = k.client_id
	where c.name like 'Bench client %'
)
insert into access_log (at, actor_user_id, actor_role, actor_organisation_id, action,
		target_type, target_id, subject_key, outcome, client_address, user_agent)
	select now() - (g * interval '31 seconds'), u.id, 'instructor', s.id,
		(array['client.read', 'screening.read', 'client.listed', 'screening.recorded', 'referral.read'])[(g % 5) + 1],
		'client', k.client_id::text, k.key,
		case when g % 97 = 0 then 'refused' else 'success' end, '192.0.2.10', 'bench/1.0'
	from generate_series(1, 1000000) g
	join keys k on k.n = (g % 10000) + 1
	cross join (select id from users where email = 'bench-instructor@bench.example') u
	cross join (select id from organisations where name = 'Bench studio 1') s
	order by g desc;
