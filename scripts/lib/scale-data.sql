-- The benchmark's scale dataset (`npm run bench`), made with generate_series on top of the
-- demo scenario: a large multi-site practice — 50 studios, 20 clinics, 10,000 clients (200 a
-- studio), 200,000 screenings (20 a client), 20,000 referrals (2 a client; 1,000 a clinic)
-- and the subject keys that the 1,000,000 access-log rows of scale-log.sql name (the log is
-- filled by the app's role, the only one allowed to). Every value is invented. Screenings copy
-- the shape of a demo screening, so the app reads them like any other.
-- Bench people: an instructor and an admin of the first bench studio, a physiotherapist of
-- the first bench clinic (sessions are made by the bench itself).

create temporary table bench_studios as
	select g as n, gen_random_uuid() as id from generate_series(1, 50) g;
create temporary table bench_clinics as
	select g as n, gen_random_uuid() as id from generate_series(1, 20) g;

insert into organisations (id, name, kind)
	select id, 'Bench studio ' || n, 'studio' from bench_studios;
insert into organisations (id, name, kind)
	select id, 'Bench clinic ' || n, 'clinic' from bench_clinics;

insert into users (email, name) values
	('bench-instructor@bench.example', 'Bench Instructor'),
	('bench-admin@bench.example', 'Bench Admin'),
	('bench-physio@bench.example', 'Bench Physio');
insert into memberships (user_id, organisation_id, role)
	select u.id, s.id, 'instructor' from users u, bench_studios s
	where u.email = 'bench-instructor@bench.example' and s.n = 1;
insert into memberships (user_id, organisation_id, role)
	select u.id, s.id, 'admin' from users u, bench_studios s
	where u.email = 'bench-admin@bench.example' and s.n = 1;
insert into memberships (user_id, organisation_id, role)
	select u.id, c.id, 'physiotherapist' from users u, bench_clinics c
	where u.email = 'bench-physio@bench.example' and c.n = 1;

-- 10,000 clients, 200 a studio, with intake consent and their last screening copied in.
create temporary table bench_clients as
	select g as n, gen_random_uuid() as id, ((g - 1) % 50) + 1 as studio_n
	from generate_series(1, 10000) g;
insert into clients (id, organisation_id, name, stage, birth_date, delivery, births, multiples,
		intake_consent_at, intake_consent_method, last_screened_at, last_outcome, created_at)
	select c.id, s.id, 'Bench client ' || lpad(c.n::text, 5, '0'), 'postpartum',
		(date '2025-06-01' + (c.n % 400)), 'vaginal', 1, false,
		now() - interval '200 days', 'in_person', now() - ((c.n % 30) || ' days')::interval,
		(array['within_limit', 'monitor', 'refer'])[(c.n % 3) + 1]::screening_outcome,
		now() - interval '200 days'
	from bench_clients c join bench_studios s on s.n = c.studio_n;

-- 200,000 screenings: 20 a client, a week apart, shaped like the demo's first screening.
insert into screenings (client_id, taken_at, sites, red_flags, stage, weeks_postpartum,
		outcome, reasons, warnings, rules_version, created_at)
	select c.id, now() - ((c.n % 30) || ' days')::interval - (w * interval '7 days'),
		t.sites, t.red_flags, 'postpartum', 30 - w, t.outcome, t.reasons, t.warnings,
		t.rules_version, now() - (w * interval '7 days')
	from bench_clients c
	cross join generate_series(0, 19) w
	cross join (select sites, red_flags, outcome, reasons, warnings, rules_version
		from screenings order by taken_at limit 1) t;

-- 20,000 referrals: two a client, each to a clinic, sent, in a spread of states.
insert into referrals (client_id, studio_id, clinic_id, reason, urgency, red_flags, state,
		created_at, sent_at, updated_at)
	select c.id, s.id, k.id, 'Three finger widths at the navel (invented bench data).',
		(array['routine', 'soon'])[(c.n % 2) + 1]::referral_urgency, '{}',
		(array['sent', 'accepted', 'assessed', 'declined', 'closed'])[((c.n + r) % 5) + 1]::referral_state,
		now() - ((c.n % 300) || ' days')::interval, now() - ((c.n % 300) || ' days')::interval,
		now()
	from bench_clients c
	join bench_studios s on s.n = c.studio_n
	cross join generate_series(0, 1) r
	join bench_clinics k on k.n = ((c.n + r * 7) % 20) + 1;
insert into referral_events (referral_id, from_state, to_state, at)
	select r.id, null, 'sent', r.sent_at from referrals r
	join bench_clients c on c.id = r.client_id;

-- Subject keys for every bench client (the log rows below name them).
insert into subject_keys (client_id) select id from bench_clients;
