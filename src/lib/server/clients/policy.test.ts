import { describe, expect, it } from 'vitest';
import type { Actor, Membership } from '../actor';
import { mayListClients, mayReadClient, mayWriteClient, studioForNewClient } from './policy';

const STUDIO = '00000000-0000-4000-8000-000000000001';
const OTHER = '00000000-0000-4000-8000-000000000002';
const CLINIC = '00000000-0000-4000-8000-000000000003';
const CLIENT = '00000000-0000-4000-8000-0000000000c1';

function actor(
	memberships: Array<Omit<Membership, 'organisationName'>>,
	clientId: string | null = null
): Actor {
	return {
		userId: '00000000-0000-4000-8000-0000000000aa',
		email: 'a@test.example',
		name: null,
		memberships: memberships.map((m) => ({ ...m, organisationName: 'x' })),
		clientId,
		activeOrganisationId: null
	};
}

const instructor = actor([{ organisationId: STUDIO, kind: 'studio', role: 'instructor' }]);
const adminOnly = actor([{ organisationId: STUDIO, kind: 'studio', role: 'admin' }]);
const physio = actor([{ organisationId: CLINIC, kind: 'clinic', role: 'physiotherapist' }]);
const herself = actor([], CLIENT);
const record = { id: CLIENT, organisationId: STUDIO };

describe('client policy', () => {
	it('lets instructors of her studio read and write her record', () => {
		expect(mayReadClient(instructor, record)).toBe(true);
		expect(mayWriteClient(instructor, record)).toBe(true);
		expect(mayListClients(instructor)).toBe(true);
	});

	it('keeps other studios, clinics and admins without the instructor role out', () => {
		const elsewhere = actor([{ organisationId: OTHER, kind: 'studio', role: 'instructor' }]);
		for (const who of [elsewhere, adminOnly, physio]) {
			expect(mayReadClient(who, record)).toBe(false);
			expect(mayWriteClient(who, record)).toBe(false);
		}
		expect(mayListClients(physio)).toBe(false);
	});

	it('lets the client read but not change her own record', () => {
		expect(mayReadClient(herself, record)).toBe(true);
		expect(mayWriteClient(herself, record)).toBe(false);
		expect(mayReadClient(herself, { id: 'someone-else', organisationId: STUDIO })).toBe(false);
	});

	it('places a new client in the studio asked for, the active one, or the only one', () => {
		expect(studioForNewClient(instructor)).toBe(STUDIO);
		expect(studioForNewClient(instructor, OTHER)).toBeNull();
		const two = actor([
			{ organisationId: STUDIO, kind: 'studio', role: 'instructor' },
			{ organisationId: OTHER, kind: 'studio', role: 'instructor' }
		]);
		expect(studioForNewClient(two)).toBeNull();
		expect(studioForNewClient({ ...two, activeOrganisationId: OTHER })).toBe(OTHER);
		expect(studioForNewClient(two, STUDIO)).toBe(STUDIO);
		expect(studioForNewClient(physio)).toBeNull();
	});
});
