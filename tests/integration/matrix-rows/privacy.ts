// Expected rows for the client's privacy centre, merged into the matrix in
// authorization-matrix.test.ts. Only a person with a client record has an access list; to
// everyone else it is not there (404, logged).
import { everyone, only, type Person, type Row } from '../authorization-matrix';

const CLIENTS: Person[] = ['client@client.example', 'client2@client.example'];
const api = (table: Row['expect']): Row['expect'] => ({ ...table, anonymous: 401 });

export const PRIVACY_ROWS: Row[] = [
	{ route: '/(app)/privacy', call: 'GET', expect: only(CLIENTS, 200) },
	{ route: '/api/v1/me/access', call: 'GET', expect: api(only(CLIENTS, 200)) },
	{ route: '/api/v1/me/export', call: 'GET', expect: api(only(CLIENTS, 200)) },
	// The canonical URL of our FHIR code system: public, like any code system's page.
	{
		route: '/fhir/CodeSystem/[id]',
		call: 'GET',
		sample: { id: 'seamwell' },
		expect: everyone(200)
	}
];
