import { describe, expect, it } from 'vitest';
import { GET } from '../../src/routes/api/v1/me/+server';
import { access, callerFor, makeOrganisation, makePerson } from './people-fixtures';

type MeEvent = Parameters<typeof GET>[0];

function event(locals: Pick<App.Locals, 'actor' | 'access'>): MeEvent {
	const url = new URL('http://127.0.0.1/api/v1/me');
	return { url, locals, request: new Request(url) } as unknown as MeEvent;
}

describe('GET /api/v1/me', () => {
	it('answers the signed-in person with her memberships and no client record', async () => {
		const studio = await makeOrganisation('studio');
		const clinic = await makeOrganisation('clinic');
		const person = await makePerson([
			{ organisationId: studio, role: 'admin' },
			{ organisationId: studio, role: 'instructor' },
			{ organisationId: clinic, role: 'physiotherapist' }
		]);
		const caller = await callerFor(person.userId);
		const response = await GET(event({ actor: caller.actor, access: caller.access }));
		expect(response.status).toBe(200);
		const body = await response.json();
		expect(Object.keys(body).sort()).toEqual(['clientId', 'email', 'id', 'memberships', 'name']);
		expect(body).toMatchObject({ id: person.userId, email: person.email, clientId: null });
		expect(body.memberships).toHaveLength(3);
		expect(body.memberships).toEqual(
			expect.arrayContaining([
				{
					organisationId: studio,
					organisationName: expect.stringContaining('Test studio'),
					kind: 'studio',
					role: 'admin'
				},
				{
					organisationId: clinic,
					organisationName: expect.stringContaining('Test clinic'),
					kind: 'clinic',
					role: 'physiotherapist'
				}
			])
		);
	});

	it('answers an anonymous caller 401 with a problem document', async () => {
		const response = await GET(event({ actor: null, access: access() }));
		expect(response.status).toBe(401);
		expect(response.headers.get('content-type')).toBe('application/problem+json');
		expect(await response.json()).toMatchObject({ type: '/problems/unauthenticated', status: 401 });
	});
});
