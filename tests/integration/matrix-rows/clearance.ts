// Expected rows for assessments and clearances, merged into the matrix in
// authorization-matrix.test.ts.
//
// Samples (src/lib/server/demo/clearances.ts): Noor Abernethy of Linden Row Studio was
// referred to Fernbank Pelvic Health, assessed by physio@clinic.example, and has a current
// clearance from her. Hana Lindqvist (client@client.example) has none and no referral. Maya
// Okonjo's referral is accepted, not yet assessed. NOBODY is a well-formed id that names
// nothing. API mutations send `{}`: the body is checked before anything is looked up, so
// every signed-in caller gets 422.
import { only, signedIn, type Person, type Row } from '../authorization-matrix';

const LINDEN_INSTRUCTORS: Person[] = [
	'admin@studio.example',
	'instructor@studio.example',
	'instructor2@studio.example'
];
const FERNBANK_PHYSIO: Person[] = ['physio@clinic.example'];

const NOOR = { id: '<client:Noor Abernethy>' };
const HANA = { id: '<client:Hana Lindqvist>' };
const NOOR_REFERRAL = { id: '<referral:Noor Abernethy>' };
const MAYA_REFERRAL = { id: '<referral:Maya Okonjo>' };
const NOBODY = { id: '00000000-0000-4000-8000-000000000000' };

const forbiddenTo = (people: Person[]) => Object.fromEntries(people.map((p) => [p, 403]));

export const CLEARANCE_ROWS: Row[] = [
	// The referral page's assessment and clearance forms: the clinic's physiotherapist gets an
	// empty form back (400); anyone else finds no such form (404).
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/assess',
		sample: MAYA_REFERRAL,
		expect: only(FERNBANK_PHYSIO, 400)
	},
	{
		route: '/(app)/referrals/[id]',
		call: 'POST ?/clear',
		sample: MAYA_REFERRAL,
		expect: only(FERNBANK_PHYSIO, 400)
	},

	// Reading a clearance: her studio, the clinic that set it, she herself; nobody else knows.
	{
		route: '/api/v1/clients/[id]/clearance',
		call: 'GET',
		sample: NOOR,
		expect: only([...LINDEN_INSTRUCTORS, ...FERNBANK_PHYSIO], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/clearance',
		call: 'GET',
		sample: HANA,
		expect: only([...LINDEN_INSTRUCTORS, 'client@client.example'], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/clearance',
		call: 'GET',
		sample: NOBODY,
		expect: only([], 200, { anonymous: 401 })
	},
	{
		route: '/api/v1/clients/[id]/clearance',
		call: 'POST',
		sample: NOOR,
		expect: signedIn(422, 401)
	},

	// Findings are the clinic's: its physiotherapists read them; the referring studio 403.
	{
		route: '/api/v1/referrals/[id]/assessment',
		call: 'GET',
		sample: NOOR_REFERRAL,
		expect: {
			...only(FERNBANK_PHYSIO, 200, { anonymous: 401 }),
			...forbiddenTo(LINDEN_INSTRUCTORS)
		}
	},
	{
		route: '/api/v1/referrals/[id]/assessment',
		call: 'GET',
		sample: MAYA_REFERRAL,
		expect: {
			...only(FERNBANK_PHYSIO, 200, { anonymous: 401 }),
			...forbiddenTo(LINDEN_INSTRUCTORS)
		}
	},
	{
		route: '/api/v1/referrals/[id]/assessment',
		call: 'POST',
		sample: MAYA_REFERRAL,
		expect: signedIn(422, 401)
	}
];
