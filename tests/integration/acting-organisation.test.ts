import { describe, expect, it } from 'vitest';
import { accessRole, loadActor } from '../../src/lib/server/people/sessions';
import { makeOrganisation, makePerson } from './people-fixtures';

// One person, two organisations: she chooses where she acts (a cookie holding the
// organisation's id), and that choice is checked against her memberships on every request.
describe('the organisation a person acts in', () => {
	it('follows her choice among her memberships, and the log names that role and place', async () => {
		const studio = await makeOrganisation('studio');
		const clinic = await makeOrganisation('clinic');
		const person = await makePerson([
			{ organisationId: studio, role: 'instructor' },
			{ organisationId: studio, role: 'admin' },
			{ organisationId: clinic, role: 'physiotherapist' }
		]);

		const inClinic = await loadActor(person.userId, clinic);
		expect(inClinic?.activeOrganisationId).toBe(clinic);
		expect(accessRole(inClinic!)).toBe('physiotherapist');

		const inStudio = await loadActor(person.userId, studio);
		expect(inStudio?.activeOrganisationId).toBe(studio);
		expect(accessRole(inStudio!)?.split('+').sort()).toEqual(['admin', 'instructor']);
		expect(inStudio?.memberships).toHaveLength(3);
	});

	it('ignores a choice she does not hold (a forged cookie) and falls back to one she does', async () => {
		const studio = await makeOrganisation('studio');
		const elsewhere = await makeOrganisation('clinic');
		const person = await makePerson([{ organisationId: studio, role: 'instructor' }]);
		const actor = await loadActor(person.userId, elsewhere);
		expect(actor?.activeOrganisationId).toBe(studio);
		expect(actor?.memberships.map((m) => m.organisationId)).not.toContain(elsewhere);
	});
});
