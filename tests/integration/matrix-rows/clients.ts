// Expected rows for client records and screenings, to merge into authorization-matrix.ts.
//
// Samples: `<client:NAME>` stands for the id of the demo client of that name (see
// src/lib/server/demo/clients.ts): `select id from clients where name = NAME`. Hana Lindqvist
// (client@client.example) belongs to Linden Row Studio; Ottilie Brandvold to Harbour Movement.
// Form actions are called with an empty form; API mutations with the body `{}` as JSON and a
// same-origin Origin header. Policy comes before parsing in every form action, so a person
// without access gets 404 rather than the form's 400.
import { only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const ALL_INSTRUCTORS: Person[] = [...LINDEN_INSTRUCTORS, 'instructor@otherstudio.example'];
const HANA = { id: '<client:Hana Lindqvist>' };
const OTTILIE = { id: '<client:Ottilie Brandvold>' };

export const CLIENT_ROWS: Row[] = [
	// Pages
	{ route: '/(app)/clients', call: 'GET', expect: only(ALL_INSTRUCTORS, 200) },
	{ route: '/(app)/clients/new', call: 'GET', expect: only(ALL_INSTRUCTORS, 200) },
	{ route: '/(app)/clients/new', call: 'POST ?/default', expect: only(ALL_INSTRUCTORS, 400) },
	{
		route: '/(app)/clients/[id]',
		call: 'GET',
		sample: HANA,
		expect: only([...LINDEN_INSTRUCTORS, 'client@client.example'], 200)
	},
	{
		route: '/(app)/clients/[id]',
		call: 'GET',
		sample: OTTILIE,
		expect: only(['instructor@otherstudio.example'], 200)
	},
	{
		route: '/(app)/clients/[id]',
		call: 'GET',
		sample: { id: 'not-a-uuid' },
		expect: only([], 200)
	},
	{
		route: '/(app)/clients/[id]',
		call: 'POST ?/consent',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 400)
	},
	// Hana has an e-mail address: a permitted instructor sends the invitation again (200).
	{
		route: '/(app)/clients/[id]',
		call: 'POST ?/invite',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200)
	},
	{
		route: '/(app)/clients/[id]/edit',
		call: 'GET',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200)
	},
	{
		route: '/(app)/clients/[id]/edit',
		call: 'POST ?/default',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 400)
	},
	{
		route: '/(app)/clients/[id]/screenings/new',
		call: 'GET',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200)
	},
	{
		route: '/(app)/clients/[id]/screenings/new',
		call: 'POST ?/default',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 400)
	},
	{
		route: '/(app)/my-record',
		call: 'GET',
		expect: only(['client@client.example', 'client2@client.example'], 200)
	},

	// JSON API (anonymous: 401 problem)
	{
		route: '/api/v1/clients',
		call: 'GET',
		expect: only(ALL_INSTRUCTORS, 200, { others: 403, anonymous: 401 })
	},
	// The body is checked before the studio: `{}` is a 422 for anyone signed in.
	{ route: '/api/v1/clients', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/clients/[id]',
		call: 'GET',
		sample: HANA,
		expect: only([...LINDEN_INSTRUCTORS, 'client@client.example'], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]',
		call: 'GET',
		sample: { id: 'not-a-uuid' },
		expect: only([], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]',
		call: 'PATCH',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/screenings',
		call: 'GET',
		sample: HANA,
		expect: only([...LINDEN_INSTRUCTORS, 'client@client.example'], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/screenings',
		call: 'POST',
		sample: HANA,
		expect: signedIn(422, 401)
	},
	{
		route: '/api/v1/clients/[id]/invitation',
		call: 'POST',
		sample: HANA,
		expect: only(LINDEN_INSTRUCTORS, 202, { anonymous: 401 })
	}
];
