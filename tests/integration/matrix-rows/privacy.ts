// Expected rows for the client's privacy centre, merged into the matrix in
// authorization-matrix.test.ts. Only a person with a client record has an access list; to
// everyone else it is not there (404, logged).
import { everyone, only, signedIn, type Person, type Row } from '../authorization-matrix';

const CLIENTS: Person[] = ['client@client.example', 'client2@client.example'];
// Requests to erase data are answered by the studio's admin (Linden Row's is also an instructor).
const STUDIO_ADMIN: Person[] = ['admin@studio.example'];
const CLARA_REQUEST = { id: '<erasure:Clara Nwosu>' };
const api = (table: Row['expect']): Row['expect'] => ({ ...table, anonymous: 401 });

export const PRIVACY_ROWS: Row[] = [
	{ route: '/(app)/privacy', call: 'GET', expect: only(CLIENTS, 200) },
	{ route: '/api/v1/me/access', call: 'GET', expect: api(only(CLIENTS, 200)) },
	{ route: '/api/v1/me/export', call: 'GET', expect: api(only(CLIENTS, 200)) },
	// Erasure: the client asks (an empty POST creates her request: 201); the studio admin
	// lists, reads and decides. An admin of a clinic or of another studio is refused the list
	// (403) and does not see Linden Row's request (404). The decision is called with an empty
	// body: the admin gets 422 (no decision), so nothing is erased by the matrix.
	{ route: '/api/v1/me/erasure-requests', call: 'GET', expect: api(signedIn(200)) },
	{ route: '/api/v1/me/erasure-requests', call: 'POST', expect: api(only(CLIENTS, 201)) },
	{
		route: '/api/v1/erasure-requests',
		call: 'GET',
		expect: api(only(STUDIO_ADMIN, 200, { others: 403 }))
	},
	{
		route: '/api/v1/erasure-requests/[id]',
		call: 'GET',
		sample: CLARA_REQUEST,
		expect: api(only(STUDIO_ADMIN, 200))
	},
	{
		route: '/api/v1/erasure-requests/[id]/decision',
		call: 'POST',
		sample: CLARA_REQUEST,
		expect: api(only(STUDIO_ADMIN, 422))
	},
	{ route: '/(app)/admin/data-requests', call: 'GET', expect: only(STUDIO_ADMIN, 200) },
	{
		route: '/(app)/admin/data-requests/[id]',
		call: 'GET',
		sample: CLARA_REQUEST,
		expect: only(STUDIO_ADMIN, 200)
	},
	{
		route: '/(app)/admin/data-requests/[id]',
		call: 'POST ?/approve',
		sample: CLARA_REQUEST,
		expect: only(STUDIO_ADMIN, 400)
	},
	{
		route: '/(app)/admin/data-requests/[id]',
		call: 'POST ?/decline',
		sample: CLARA_REQUEST,
		expect: only(STUDIO_ADMIN, 400)
	},
	{ route: '/(app)/privacy', call: 'POST ?/erase', expect: only(CLIENTS, 400) },
	// The canonical URL of our FHIR code system: public, like any code system's page.
	{
		route: '/fhir/CodeSystem/[id]',
		call: 'GET',
		sample: { id: 'seamwell' },
		expect: everyone(200)
	}
];
