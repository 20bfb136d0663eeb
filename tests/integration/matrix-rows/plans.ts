// Expected rows for the exercise library and session plans, merged in authorization-matrix.test.ts.
//
// Samples: `<plan:TITLE>` is the demo plan of that title (see src/lib/server/demo/plans.ts),
// owned by Linden Row Studio. The class plan has a blocked cell, so `POST …/ready` with `{}`
// answers 409 to its instructors and changes nothing.
import { only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const ALL_INSTRUCTORS: Person[] = [...LINDEN_INSTRUCTORS, 'instructor@otherstudio.example'];
const CLASS = { id: '<plan:Tuesday postnatal mat class>' };
const HANA = { id: '<client:Hana Lindqvist>' };

export const PLAN_ROWS: Row[] = [
	// Pages (policy before the form: a person without access gets 404, not the form's 400)
	{ route: '/(app)/plans', call: 'GET', expect: only(ALL_INSTRUCTORS, 200, { others: 403 }) },
	{ route: '/(app)/plans', call: 'POST ?/create', expect: only(ALL_INSTRUCTORS, 400) },
	{
		route: '/(app)/plans/library',
		call: 'GET',
		expect: only(ALL_INSTRUCTORS, 200, { others: 403 })
	},
	{ route: '/(app)/plans/library', call: 'POST ?/create', expect: only(ALL_INSTRUCTORS, 400) },
	// An empty form names no plan: 404 for everyone.
	{ route: '/(app)/plans', call: 'POST ?/duplicate', expect: only([], 200) },
	{ route: '/(app)/plans/[id]', call: 'GET', sample: CLASS, expect: only(LINDEN_INSTRUCTORS, 200) },
	{
		route: '/(app)/plans/[id]/sheet',
		call: 'GET',
		sample: CLASS,
		expect: only(LINDEN_INSTRUCTORS, 200)
	},
	// JSON API (anonymous: 401 problem)
	{
		route: '/api/v1/exercises',
		call: 'GET',
		expect: only(ALL_INSTRUCTORS, 200, { others: 403, anonymous: 401 })
	},
	// The body is checked first: `{}` is a 422 for anyone signed in.
	{ route: '/api/v1/exercises', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/plans',
		call: 'GET',
		expect: only(ALL_INSTRUCTORS, 200, { others: 403, anonymous: 401 })
	},
	{ route: '/api/v1/plans', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/plans/[id]',
		call: 'GET',
		sample: CLASS,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/plans/[id]',
		call: 'GET',
		sample: { id: 'not-a-uuid' },
		expect: only([], 200, { anonymous: 401 })
	},
	{ route: '/api/v1/plans/[id]', call: 'PATCH', sample: CLASS, expect: signedIn(422, 401) },
	{
		route: '/api/v1/plans/[id]/check',
		call: 'GET',
		sample: CLASS,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/plans/[id]/ready',
		call: 'POST',
		sample: CLASS,
		expect: only(LINDEN_INSTRUCTORS, 409, { anonymous: 401 })
	},
	{
		route: '/api/v1/plans/[id]/print',
		call: 'POST',
		sample: CLASS,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/clearance/review-requests',
		call: 'POST',
		sample: HANA,
		expect: signedIn(422, 401)
	}
];
