// Expected rows for the client's self-checks and home practice, merged in
// authorization-matrix.test.ts. In the demo, Hana shares her self-checks with Linden Row Studio.
import { everyone, only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const CLIENTS: Person[] = ['client@client.example', 'client2@client.example'];
// Every studio instructor may follow up her own studio's items (Harbour's has none here).
const INSTRUCTORS: Person[] = [...LINDEN_INSTRUCTORS, 'instructor@otherstudio.example'];
const HANA = { id: '<client:Hana Lindqvist>' };

export const SELF_CARE_ROWS: Row[] = [
	{ route: '/(app)/check', call: 'GET', expect: only(CLIENTS, 200) },
	{ route: '/(app)/check', call: 'POST ?/record', expect: only(CLIENTS, 400) },
	{ route: '/(app)/check', call: 'POST ?/sharing', expect: only(CLIENTS, 400) },
	{ route: '/(app)/practice', call: 'GET', expect: only(CLIENTS, 200) },
	// Her own forms: an empty post is not the page's form (400, nothing recorded); anyone
	// else finds no such page (404, logged).
	{ route: '/(app)/practice', call: 'POST ?/done', expect: only(CLIENTS, 400) },
	{ route: '/(app)/practice', call: 'POST ?/reminder', expect: only(CLIENTS, 400) },
	// An empty form is not the page's form: 400 for her instructors, 404 for everyone else.
	{
		route: '/(app)/clients/[id]',
		call: 'POST ?/homePractice',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 400)
	},
	// "Followed up" on the instructor dashboard: an empty form is 400 for instructors; the
	// API refuses anyone else (403) before it reads the body, and an empty body is 422.
	{ route: '/(app)/instructor', call: 'POST ?/followedUp', expect: only(INSTRUCTORS, 400) },
	{
		route: '/api/v1/follow-ups',
		call: 'POST',
		expect: only(INSTRUCTORS, 422, { others: 403, anonymous: 401 })
	},
	// Without sign-in by design: the link in the reminder mail. A bad link is a 400.
	{ route: '/reminders/unsubscribe', call: 'GET', expect: everyone(200) },
	{ route: '/reminders/unsubscribe', call: 'POST ?/default', expect: everyone(400) },
	// JSON API (anonymous: 401 problem)
	{
		route: '/api/v1/me/self-checks',
		call: 'GET',
		expect: only(CLIENTS, 200, { anonymous: 401 })
	},
	{ route: '/api/v1/me/self-checks', call: 'POST', expect: signedIn(422, 401) },
	{ route: '/api/v1/me/self-check-sharing', call: 'PUT', expect: signedIn(422, 401) },
	{
		route: '/api/v1/me/home-practice',
		call: 'GET',
		expect: only(CLIENTS, 200, { anonymous: 401 })
	},
	{ route: '/api/v1/me/home-practice/sessions', call: 'POST', expect: signedIn(422, 401) },
	{ route: '/api/v1/me/home-practice/reminder', call: 'PUT', expect: signedIn(422, 401) },
	{
		route: '/api/v1/clients/[id]/self-checks',
		call: 'GET',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/home-practice',
		call: 'GET',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/home-practice',
		call: 'PUT',
		sample: HANA,
		expect: signedIn(422, 401)
	}
];
