// Expected rows for consents, consent requests, clinics and referrals, to merge into
// authorization-matrix.ts.
//
// Samples: `<referral:NAME>` stands for the demo referral (Linden Row Studio → Fernbank Pelvic
// Health) of the demo client of that name, one per consent state (src/lib/server/referrals/
// demo.ts; the demo seed must call seedDemoReferrals after the clients): Bea Sorensen — consent
// active, sent, named to physio@clinic.example; Clara Nwosu — consent withdrawn, so the
// referral was withdrawn; Ines Farrow — no consent, a draft. resolveSamples needs the kind:
//   referral: select r.id from referrals r join clients c on c.id = r.client_id where c.name = NAME
// NOBODY is a well-formed id that names nothing. Form actions are called with an empty form;
// API mutations with the body `{}` as JSON and a same-origin Origin header: the body is checked
// before the record is looked up, so every signed-in caller gets the 422 (nothing is read).
import { only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const ALL_INSTRUCTORS: Person[] = [...LINDEN_INSTRUCTORS, 'instructor@otherstudio.example'];
const PHYSIOS: Person[] = ['physio@clinic.example', 'physio@otherclinic.example'];
const CLIENTS: Person[] = ['client@client.example', 'client2@client.example'];
const ADMINS: Person[] = ['admin@studio.example', 'admin@clinic.example'];
const FERNBANK_PHYSIO: Person[] = ['physio@clinic.example'];

const ACTIVE = { id: '<referral:Bea Sorensen>' };
const WITHDRAWN = { id: '<referral:Clara Nwosu>' };
const NONE = { id: '<referral:Ines Farrow>' };
const NOBODY = { id: '00000000-0000-4000-8000-000000000000' };
const api = (table: Row['expect']): Row['expect'] => ({ ...table, anonymous: 401 });

export const REFERRAL_ROWS: Row[] = [
	// Pages
	{ route: '/(app)/referrals', call: 'GET', expect: only([...ALL_INSTRUCTORS, ...PHYSIOS], 200) },
	{ route: '/(app)/referrals/new', call: 'GET', expect: only(ALL_INSTRUCTORS, 200) },
	{ route: '/(app)/referrals/new', call: 'POST ?/default', expect: only(ALL_INSTRUCTORS, 400) },
	{
		route: '/(app)/referrals/[id]',
		call: 'GET',
		sample: ACTIVE,
		expect: only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200)
	},
	// Sharing ended: the clinic still reads what it received (labelled), nothing live.
	{
		route: '/(app)/referrals/[id]',
		call: 'GET',
		sample: WITHDRAWN,
		expect: only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200)
	},
	// A draft (no consent yet): the clinic never sees it.
	{
		route: '/(app)/referrals/[id]',
		call: 'GET',
		sample: NONE,
		expect: only(LINDEN_INSTRUCTORS, 200)
	},
	{ route: '/(app)/referrals/[id]', call: 'GET', sample: NOBODY, expect: only([], 200) },
	{
		route: '/(app)/referrals/[id]',
		call: 'GET',
		sample: { id: 'not-a-uuid' },
		expect: only([], 200)
	},
	// An empty form names no step: it comes back (400) to those who may see the referral; the
	// page it would come back on is not there (404, logged) for anyone else.
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/transition',
		sample: ACTIVE,
		expect: only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 400)
	},
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/requestConsent',
		sample: NONE,
		expect: only(LINDEN_INSTRUCTORS, 400)
	},
	{ route: '/(app)/consents', call: 'GET', expect: only(CLIENTS, 200) },
	{ route: '/(app)/consents', call: 'POST ?/give', expect: only(CLIENTS, 400) },
	// Withdrawing with no consent named: nothing to withdraw.
	{ route: '/(app)/consents', call: 'POST ?/withdraw', expect: only([], 200) },

	// JSON API
	{ route: '/api/v1/clinics', call: 'GET', expect: signedIn(200, 401) },
	{
		route: '/api/v1/consents',
		call: 'GET',
		expect: api(only([...CLIENTS, ...ADMINS], 200, { others: 403 }))
	},
	{ route: '/api/v1/consents', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/consents/[id]/withdraw',
		call: 'POST',
		sample: NOBODY,
		expect: api(only([], 200))
	},
	{ route: '/api/v1/consent-requests', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/referrals',
		call: 'GET',
		expect: api(only([...ALL_INSTRUCTORS, ...PHYSIOS], 200, { others: 403 }))
	},
	{ route: '/api/v1/referrals', call: 'POST', expect: signedIn(422, 401) },
	{
		route: '/api/v1/referrals/[id]',
		call: 'GET',
		sample: ACTIVE,
		expect: api(only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200))
	},
	{
		route: '/api/v1/referrals/[id]',
		call: 'GET',
		sample: WITHDRAWN,
		expect: api(only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200))
	},
	{
		route: '/api/v1/referrals/[id]',
		call: 'GET',
		sample: NONE,
		expect: api(only(LINDEN_INSTRUCTORS, 200))
	},
	{ route: '/api/v1/referrals/[id]', call: 'GET', sample: NOBODY, expect: api(only([], 200)) },
	// The referral as a FHIR Bundle: the same readers as the referral itself.
	{
		route: '/api/v1/referrals/[id]/fhir',
		call: 'GET',
		sample: ACTIVE,
		expect: api(only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200))
	},
	{
		route: '/api/v1/referrals/[id]/fhir',
		call: 'GET',
		sample: NONE,
		expect: api(only(LINDEN_INSTRUCTORS, 200))
	},
	{ route: '/api/v1/referrals/[id]/fhir', call: 'GET', sample: NOBODY, expect: api(only([], 200)) },
	// Her live screening history: the clinic while consent lasts; refused (403, logged) after.
	{
		route: '/api/v1/referrals/[id]/screenings',
		call: 'GET',
		sample: ACTIVE,
		expect: api(only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200))
	},
	{
		route: '/api/v1/referrals/[id]/screenings',
		call: 'GET',
		sample: WITHDRAWN,
		expect: api({ ...only(LINDEN_INSTRUCTORS, 200), 'physio@clinic.example': 403 })
	},
	{
		route: '/api/v1/referrals/[id]/screenings',
		call: 'GET',
		sample: NONE,
		expect: api(only(LINDEN_INSTRUCTORS, 200))
	},
	{
		route: '/api/v1/referrals/[id]/transitions',
		call: 'POST',
		sample: ACTIVE,
		expect: signedIn(422, 401)
	}
];
