import { beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { REFERRAL_STATES, TRANSITION_TARGETS, type ReferralState } from '../../domain/referral';
import { requireEnv } from '../../../../tests/support/services';
import { transitionReferral } from './service';
import {
	addConsent,
	addReferral,
	logRows,
	makeClient,
	makeMember,
	makeOrg,
	problemOf,
	stateOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';

// The whole transition table against the real database: every state × every target × every
// kind of caller. The expected answers are written out here by hand from the table
// (Seamwell's own product rule, no outside source) — not computed from the domain's table.

type Role =
	| 'creator'
	| 'otherInstructor'
	| 'namedPhysio'
	| 'otherPhysioSameClinic'
	| 'physioOtherClinic'
	| 'instructorOtherStudio'
	| 'client'
	| 'clinicAdmin'
	| 'studioAdmin';

const ALLOWED: Record<string, ReferralState[]> = {
	// to → from-states where the studio may make the move
	'studio:sent': ['draft'],
	'studio:withdrawn': ['draft', 'sent', 'accepted'],
	// to → from-states where the named (or assigned) physiotherapist may make the move
	'physio:accepted': ['sent'],
	'physio:declined': ['sent'],
	'physio:assessed': ['accepted'],
	'physio:closed': ['assessed']
};

/** The answer each caller gets, by hand from the table. */
function expected(role: Role, from: ReferralState, to: ReferralState): number {
	const studioSide = role === 'creator' || role === 'otherInstructor';
	const clinicSide = role === 'namedPhysio' || role === 'otherPhysioSameClinic';
	if (!studioSide && !clinicSide) return 404; // may not know of it at all
	if (clinicSide && from === 'draft') return 404; // the clinic never sees drafts
	if (studioSide) {
		if (to !== 'sent' && to !== 'withdrawn') return 403;
		return ALLOWED[`studio:${to}`]!.includes(from) ? 200 : 409;
	}
	if (to === 'sent' || to === 'withdrawn') return 403;
	if (!ALLOWED[`physio:${to}`]!.includes(from)) return 409;
	// The move exists from here, but it is the named physiotherapist's to make.
	return role === 'namedPhysio' ? 200 : 403;
}

let studio: Org;
let clinic: Org;
let otherStudio: Org;
let otherClinic: Org;
let people: Record<Role, Person>;
let client: ClientPerson;

beforeAll(async () => {
	studio = await makeOrg('studio');
	clinic = await makeOrg('clinic');
	otherStudio = await makeOrg('studio', 'other studio');
	otherClinic = await makeOrg('clinic', 'other clinic');
	client = await makeClient(studio);
	people = {
		creator: await makeMember(studio, 'instructor'),
		otherInstructor: await makeMember(studio, 'instructor', 'colleague'),
		namedPhysio: await makeMember(clinic, 'physiotherapist'),
		otherPhysioSameClinic: await makeMember(clinic, 'physiotherapist', 'colleague-physio'),
		physioOtherClinic: await makeMember(otherClinic, 'physiotherapist', 'elsewhere'),
		instructorOtherStudio: await makeMember(otherStudio, 'instructor', 'elsewhere'),
		client,
		clinicAdmin: await makeMember(clinic, 'admin'),
		studioAdmin: await makeMember(studio, 'admin')
	};
	// Consent in force throughout, so this walk tests roles and states only.
	await addConsent(client, studio, clinic);
});

const ROLES: Role[] = [
	'creator',
	'otherInstructor',
	'namedPhysio',
	'otherPhysioSameClinic',
	'physioOtherClinic',
	'instructorOtherStudio',
	'client',
	'clinicAdmin',
	'studioAdmin'
];

/** A referral from the creator's studio to the clinic, in the given state (named physio by default). */
const referralIn = (state: ReferralState, physioId: string | null = people.namedPhysio.userId) =>
	addReferral({
		clientId: client.clientId,
		studio,
		clinic,
		createdBy: people.creator.userId,
		state,
		physioId
	});

describe('every from × to × role', () => {
	it('has the targets the issue names', () => {
		expect([...TRANSITION_TARGETS].sort()).toEqual(
			['accepted', 'assessed', 'closed', 'declined', 'sent', 'withdrawn'].sort()
		);
	});

	for (const role of ROLES) {
		it(`answers ${role} as the table says`, async () => {
			const mismatches: string[] = [];
			for (const from of REFERRAL_STATES) {
				for (const to of TRANSITION_TARGETS) {
					const id = await referralIn(from);
					const want = expected(role, from, to);
					const got = await statusOf(
						transitionReferral(people[role].caller, id, { to, reason: 'a reason for the step' })
					);
					const after = await stateOf(id);
					if (got !== want) mismatches.push(`${from}→${to}: got ${got}, want ${want}`);
					// Nothing changes unless the move succeeded.
					const wantState = want === 200 ? to : from;
					if (after !== wantState)
						mismatches.push(`${from}→${to}: state ${after}, want ${wantState}`);
				}
			}
			expect(mismatches).toEqual([]);
		});
	}

	it('logs every refused move for the one who tried', async () => {
		const id = await referralIn('closed');
		const before = (await logRows(people.creator.userId, 'referral.transitioned')).length;
		const problem = await problemOf(
			transitionReferral(people.creator.caller, id, { to: 'withdrawn', reason: 'no longer needed' })
		);
		expect(problem.status).toBe(409);
		expect(problem.type).toMatch(/invalid-transition$/);
		const rows = await logRows(people.creator.userId, 'referral.transitioned');
		expect(rows.length).toBe(before + 1);
		expect(rows[0]).toMatchObject({ outcome: 'refused', targetId: id });
		expect(rows[0]!.subjectKey).toBeTruthy();
	});
});

describe('reasons', () => {
	it('withdrawing and declining need a reason: 422 naming the field, nothing changed', async () => {
		const sent = await referralIn('sent');
		for (const [who, to] of [
			['creator', 'withdrawn'],
			['namedPhysio', 'declined']
		] as const) {
			const problem = await problemOf(
				transitionReferral(people[who].caller, sent, { to, reason: null })
			);
			expect(problem.status).toBe(422);
			expect(problem.errors).toEqual([{ pointer: '/reason', message: 'required' }]);
			expect(await stateOf(sent)).toBe('sent');
		}
	});

	it('keeps who, when and why of each step', async () => {
		const id = await referralIn('sent');
		await transitionReferral(people.namedPhysio.caller, id, {
			to: 'declined',
			reason: 'Outside our service area'
		});
		const { getReferral } = await import('./service');
		const detail = await getReferral(people.creator.caller, id);
		expect(detail.history.at(-1)).toMatchObject({
			from: 'sent',
			to: 'declined',
			byName: people.namedPhysio.name,
			byRole: 'physiotherapist',
			reason: 'Outside our service area'
		});
	});
});

describe('an unnamed referral', () => {
	it('any physiotherapist of the clinic may accept; then only she may assess and close', async () => {
		const id = await referralIn('sent', null);
		const accepted = await transitionReferral(people.otherPhysioSameClinic.caller, id, {
			to: 'accepted',
			reason: null
		});
		expect(accepted.state).toBe('accepted');
		expect(
			await statusOf(
				transitionReferral(people.namedPhysio.caller, id, { to: 'assessed', reason: null })
			)
		).toBe(403);
		expect(
			(
				await transitionReferral(people.otherPhysioSameClinic.caller, id, {
					to: 'assessed',
					reason: 'Seen in clinic; findings to follow'
				})
			).state
		).toBe('assessed');
		expect(
			(
				await transitionReferral(people.otherPhysioSameClinic.caller, id, {
					to: 'closed',
					reason: null
				})
			).state
		).toBe('closed');
	});
});

describe('a move lost to a concurrent change', () => {
	it('answers 409 invalid-transition and changes nothing', async () => {
		const id = await referralIn('sent');
		// Another connection withdraws the referral but holds its transaction open: the
		// physiotherapist's accept reads "sent", then its UPDATE waits on the row lock.
		const other = new pg.Client({ connectionString: requireEnv('DATABASE_URL') });
		await other.connect();
		try {
			await other.query('begin');
			await other.query(`update referrals set state = 'withdrawn' where id = $1`, [id]);
			const accepting = problemOf(
				transitionReferral(people.namedPhysio.caller, id, { to: 'accepted', reason: null })
			);
			// Give the accept time to read the old state and block on the row.
			await new Promise((r) => setTimeout(r, 400));
			await other.query('commit');
			const problem = await accepting;
			expect(problem.status).toBe(409);
			expect(problem.type).toMatch(/invalid-transition$/);
			expect(problem.detail).toMatch(/changed while you were acting/);
		} finally {
			await other.end();
		}
		expect(await stateOf(id)).toBe('withdrawn');
		const rows = await logRows(people.namedPhysio.userId, 'referral.transitioned');
		expect(rows[0]).toMatchObject({ outcome: 'refused', targetId: id });
	});
});
