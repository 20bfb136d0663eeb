// Who may do what: the expected answer for every page, form action and API endpoint, for
// each demo actor and for an anonymous visitor. tests/integration/authorization-matrix.test.ts
// walks src/routes and fails when a route has no row here, then calls every row as every actor.
//
// Reading a row: `route` is the SvelteKit route id; `call` is `GET` (a page or endpoint),
// `POST ?/name` (a form action; `POST ?/default` for the default action) or another method;
// `sample` fills the route's [params]; `expect` gives the answer per actor:
//   a status number (200 shown, 400 a form's "fix this", 404 "not there for you" …),
//   'signin' — sent to the sign-in page, or 'redirect' — sent on elsewhere (303).
// Form actions are called with an empty form: a permitted actor gets the form back (400),
// so the row checks who may reach the action without changing anything.

export const PEOPLE = [
	'admin@studio.example', // Linden Row Studio: admin + instructor
	'instructor@studio.example',
	'instructor2@studio.example',
	'instructor@otherstudio.example',
	'admin@clinic.example',
	'physio@clinic.example',
	'physio@otherclinic.example',
	'client@client.example',
	'client2@client.example'
] as const;

export type Person = (typeof PEOPLE)[number];
export type Actor = Person | 'anonymous';
export type Expected = number | 'signin' | 'redirect';

export interface Row {
	route: string;
	call: string;
	sample?: Record<string, string>;
	expect: Record<Actor, Expected>;
}

/** Everyone, anonymous included, gets the same answer. */
export const everyone = (answer: Expected): Record<Actor, Expected> =>
	Object.fromEntries([...PEOPLE, 'anonymous'].map((a) => [a, answer])) as Record<Actor, Expected>;

/**
 * Only `allowed` get `answer`; other signed-in people get `others` (404: not there);
 * anonymous visitors get `anonymous` (the sign-in page for the signed-in area).
 */
export function only(
	allowed: readonly Person[],
	answer: Expected,
	{ others = 404 as Expected, anonymous = 'signin' as Expected } = {}
): Record<Actor, Expected> {
	const table = Object.fromEntries(
		PEOPLE.map((p) => [p, allowed.includes(p) ? answer : others])
	) as Record<Actor, Expected>;
	table.anonymous = anonymous;
	return table;
}

export const signedIn = (answer: Expected, anonymous: Expected = 'signin') =>
	only(PEOPLE, answer, { anonymous });

const INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example',
	'instructor@otherstudio.example'
];
const PHYSIOS: Person[] = ['physio@clinic.example', 'physio@otherclinic.example'];
const ADMINS: Person[] = ['admin@studio.example', 'admin@clinic.example'];
const CLIENTS: Person[] = ['client@client.example', 'client2@client.example'];

export const MATRIX: Row[] = [
	// Public pages
	{ route: '/', call: 'GET', expect: everyone(200) },
	{ route: '/healthz', call: 'GET', expect: everyone(200) },
	// The benchmark's framework baseline answers only when the bench starts the app with it.
	{ route: '/bench/query', call: 'GET', expect: everyone(404) },
	{ route: '/problems/[slug]', call: 'GET', sample: { slug: 'not-found' }, expect: everyone(200) },
	{ route: '/signin/sent', call: 'GET', expect: everyone(200) },
	{ route: '/signin/confirm', call: 'GET', expect: everyone(200) },
	{ route: '/signin/error', call: 'GET', expect: everyone(200) },
	// Signing in: a signed-in person is sent on to her dashboard.
	{ route: '/signin', call: 'GET', expect: { ...everyone('redirect'), anonymous: 200 } },
	{ route: '/signin', call: 'POST ?/default', expect: { ...everyone('redirect'), anonymous: 400 } },
	// An invitation link that is not (or no longer) valid: the page says so; accepting is refused.
	{
		route: '/invite/[token]',
		call: 'GET',
		sample: { token: 'not-a-token' },
		expect: everyone(200)
	},
	{
		route: '/invite/[token]',
		call: 'POST ?/default',
		sample: { token: 'not-a-token' },
		expect: everyone(409)
	},

	// The signed-in area
	{ route: '/(app)/start', call: 'GET', expect: signedIn('redirect') },
	{ route: '/(app)/account', call: 'GET', expect: signedIn(200) },
	{ route: '/(app)/account', call: 'POST ?/switch', expect: signedIn(400) },
	// Her own finger-width factor. A form without the field is refused (400); an empty field
	// (the default again) comes only from the page's own form.
	{ route: '/(app)/account', call: 'POST ?/factor', expect: signedIn(400) },
	{ route: '/(app)/instructor', call: 'GET', expect: only(INSTRUCTORS, 200) },
	{ route: '/(app)/physio', call: 'GET', expect: only(PHYSIOS, 200) },
	{ route: '/(app)/client', call: 'GET', expect: only(CLIENTS, 200) },
	{ route: '/(app)/admin', call: 'GET', expect: only(ADMINS, 200) },
	{ route: '/(app)/admin', call: 'POST ?/resend', expect: only(ADMINS, 400) },
	{ route: '/(app)/admin/members', call: 'GET', expect: only(ADMINS, 200) },
	{ route: '/(app)/admin/members', call: 'POST ?/invite', expect: only(ADMINS, 400) },
	{ route: '/(app)/admin/members', call: 'POST ?/revoke', expect: only(ADMINS, 400) },
	{ route: '/(app)/admin/members', call: 'POST ?/changeRole', expect: only(ADMINS, 400) },
	{ route: '/(app)/admin/members', call: 'POST ?/deactivate', expect: only(ADMINS, 400) },

	// JSON API
	{ route: '/api/v1/me', call: 'GET', expect: signedIn(200, 401) }
];
