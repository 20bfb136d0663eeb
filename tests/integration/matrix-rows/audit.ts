// Expected rows for the admin's access-log review, merged into the matrix in
// authorization-matrix.test.ts. Only admins (of the organisation they act in) may review; to
// everyone else the log is not there (404, logged). NO_EVENT is an event id that names nothing.
import { only, type Person, type Row } from '../authorization-matrix';

const ADMINS: Person[] = ['admin@studio.example', 'admin@clinic.example'];
const NO_EVENT = { id: '999999999999' };
const api = (table: Row['expect']): Row['expect'] => ({ ...table, anonymous: 401 });

export const AUDIT_ROWS: Row[] = [
	{ route: '/api/v1/audit', call: 'GET', expect: api(only(ADMINS, 200)) },
	{ route: '/api/v1/audit/[id]', call: 'GET', sample: NO_EVENT, expect: api(only([], 200)) },
	{ route: '/api/v1/audit/verify', call: 'POST', expect: api(only(ADMINS, 200)) },
	{ route: '/api/v1/audit/summary', call: 'GET', expect: api(only(ADMINS, 200)) },
	{ route: '/(app)/admin/access-log', call: 'GET', expect: only(ADMINS, 200) },
	{ route: '/(app)/admin/access-log', call: 'POST ?/verify', expect: only(ADMINS, 200) }
];
