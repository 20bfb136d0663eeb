// Expected rows for assessment documents and the referral letter, merged into the matrix in
// authorization-matrix.test.ts.
//
// Samples: `<referral:Maya Okonjo>` is the demo's accepted referral (Linden Row Studio →
// Fernbank Pelvic Health, consent active with `documents`), carrying two demo documents named
// by file: `<document:Assessment summary for the studio.pdf>` (shareable with the studio) and
// `<document:Pelvic floor assessment notes.pdf>` (clinic only) — see src/lib/server/demo/
// documents.ts. Clara Nwosu's referral was sent and then withdrawn with her consent; Ines
// Farrow's is a draft. NOBODY is a well-formed id that names nothing.
// Form actions are called with an empty form (a permitted caller gets it back, 400; the page
// is not there, 404, for anyone else). API mutations send `{}` as JSON: the upload takes only
// multipart (415 for everyone, before anything else is looked at); the PATCH body is checked
// before the record is looked up (422 for every signed-in caller).
import { everyone, only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const FERNBANK_PHYSIO: Person[] = ['physio@clinic.example'];
const BOTH_SIDES: Person[] = [...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO];

const ACCEPTED = { id: '<referral:Maya Okonjo>' };
const WITHDRAWN = { id: '<referral:Clara Nwosu>' };
const DRAFT = { id: '<referral:Ines Farrow>' };
const SHARED = { id: '<document:Assessment summary for the studio.pdf>' };
const CLINIC_ONLY = { id: '<document:Pelvic floor assessment notes.pdf>' };
const NOBODY = { id: '00000000-0000-4000-8000-000000000000' };
const api = (table: Row['expect']): Row['expect'] => ({ ...table, anonymous: 401 });

export const DOCUMENT_ROWS: Row[] = [
	// The referral page's document forms.
	{ route: '/(app)/referrals/[id]', call: 'GET', sample: ACCEPTED, expect: only(BOTH_SIDES, 200) },
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/upload',
		sample: ACCEPTED,
		expect: only(BOTH_SIDES, 400)
	},
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/updateDocument',
		sample: ACCEPTED,
		expect: only(BOTH_SIDES, 400)
	},

	// Listing: either side; the studio only while consent with `documents` lasts (403 after,
	// logged); the clinic keeps its own; a draft is the studio's alone.
	{
		route: '/api/v1/referrals/[id]/documents',
		call: 'GET',
		sample: ACCEPTED,
		expect: api(only(BOTH_SIDES, 200))
	},
	{
		route: '/api/v1/referrals/[id]/documents',
		call: 'GET',
		sample: WITHDRAWN,
		expect: api({
			...only(FERNBANK_PHYSIO, 200),
			...Object.fromEntries(LINDEN_INSTRUCTORS.map((p) => [p, 403]))
		})
	},
	{
		route: '/api/v1/referrals/[id]/documents',
		call: 'GET',
		sample: DRAFT,
		expect: api(only(LINDEN_INSTRUCTORS, 403))
	},
	{
		route: '/api/v1/referrals/[id]/documents',
		call: 'GET',
		sample: NOBODY,
		expect: api(only([], 200))
	},
	{
		route: '/api/v1/referrals/[id]/documents',
		call: 'POST',
		sample: ACCEPTED,
		expect: everyone(415)
	},

	// The letter: either side once sent, also after sharing ended; a draft has none.
	{
		route: '/api/v1/referrals/[id]/letter',
		call: 'GET',
		sample: ACCEPTED,
		expect: api(only(BOTH_SIDES, 200))
	},
	{
		route: '/api/v1/referrals/[id]/letter',
		call: 'GET',
		sample: WITHDRAWN,
		expect: api(only(BOTH_SIDES, 200))
	},
	{
		route: '/api/v1/referrals/[id]/letter',
		call: 'GET',
		sample: DRAFT,
		expect: api(only([], 200))
	},
	{
		route: '/api/v1/referrals/[id]/letter',
		call: 'GET',
		sample: NOBODY,
		expect: api(only([], 200))
	},

	// One document: a shareable one reaches the studio; a clinic-only one is not there for it.
	{
		route: '/api/v1/documents/[id]',
		call: 'GET',
		sample: SHARED,
		expect: api(only(BOTH_SIDES, 200))
	},
	{
		route: '/api/v1/documents/[id]',
		call: 'GET',
		sample: CLINIC_ONLY,
		expect: api(only(FERNBANK_PHYSIO, 200))
	},
	{ route: '/api/v1/documents/[id]', call: 'GET', sample: NOBODY, expect: api(only([], 200)) },
	{
		route: '/api/v1/documents/[id]',
		call: 'GET',
		sample: { id: 'not-a-uuid' },
		expect: api(only([], 200))
	},
	{ route: '/api/v1/documents/[id]', call: 'PATCH', sample: SHARED, expect: signedIn(422, 401) }
];
