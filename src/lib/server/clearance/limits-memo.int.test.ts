import { beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { clearanceSchema, reviewWindow } from '$lib/clearance/schemas';
import { db } from '../db';
import {
	clients,
	homePracticeSessions,
	screenings,
	selfChecks,
	selfCheckSharing
} from '../db/schema';
import {
	addConsent,
	addReferral,
	addScreening,
	makeCast,
	makeClient,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { setClearance, todayUtc } from './clearance';
import { loadEffectiveLimits } from './limits';
import { memoSize } from './limits-memo';

// The limits memo answers from memory only while the client's limits version is unchanged.
// Each write below would leave a stale answer if its trigger were missing; the values are
// invented, the rules are the product's own (src/lib/domain/limits-*.ts).

let studio: Org;
let clinic: Org;
let instructor: Person;
let physio: Person;

beforeAll(async () => {
	({ studio, clinic, instructor, physio } = await makeCast());
});

async function versionOf(clientId: string): Promise<number> {
	const [row] = await db()
		.select({ version: clients.limitsVersion })
		.from(clients)
		.where(eq(clients.id, clientId));
	return row!.version;
}

async function limitsOf(clientId: string, scope: 'shared' | 'all' | 'none' = 'none') {
	const found = await loadEffectiveLimits(db(), [clientId], todayUtc(), { selfReports: scope });
	return found.get(clientId)!;
}

/** A client screened once, well under the referral threshold, with no signs. */
async function quietClient(): Promise<ClientPerson> {
	const client = await makeClient(studio);
	await addScreening(client.clientId, new Date('2025-03-01T10:00:00Z'), [1, 1, 1]);
	return client;
}

describe('the limits memo', () => {
	it('answers a repeated read from memory, the same frozen result', async () => {
		const client = await quietClient();
		const first = await limitsOf(client.clientId);
		const size = memoSize();
		const second = await limitsOf(client.clientId);
		expect(second).toBe(first);
		expect(memoSize()).toBe(size);
		expect(Object.isFrozen(second.categories.inversion)).toBe(true);
	});

	it('a new screening with a sign for a doctor changes the answer at once', async () => {
		const client = await quietClient();
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(false);
		// Bleeding late after the birth sends her to a doctor on its own (red-flags.ts).
		await addScreening(
			client.clientId,
			new Date('2025-03-08T10:00:00Z'),
			[1, 1, 1],
			['late_bleeding']
		);
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(true);
	});

	it('an edited or deleted screening changes the answer', async () => {
		const client = await quietClient();
		const id = await addScreening(
			client.clientId,
			new Date('2025-03-08T10:00:00Z'),
			[1, 1, 1],
			['late_bleeding']
		);
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(true);
		await db()
			.update(screenings)
			.set({ medicalSignResolved: true, redFlags: [], reasons: [] })
			.where(eq(screenings.id, id));
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(false);
		const again = await addScreening(
			client.clientId,
			new Date('2025-03-09T10:00:00Z'),
			[1, 1, 1],
			['late_bleeding']
		);
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(true);
		await db().delete(screenings).where(eq(screenings.id, again));
		expect((await limitsOf(client.clientId)).seeDoctorFirst).toBe(false);
	});

	it('a clearance set by her physiotherapist replaces the provisional answer', async () => {
		const client = await quietClient();
		await addConsent(client, studio, clinic);
		await addReferral({
			clientId: client.clientId,
			studio,
			clinic,
			createdBy: instructor.userId,
			state: 'accepted',
			physioId: physio.userId
		});
		expect((await limitsOf(client.clientId)).provisional).toBe(true);
		await setClearance(
			physio.caller,
			client.clientId,
			clearanceSchema.parse({
				categories: {
					loaded_flexion: 'hold',
					long_lever: 'hold',
					front_loaded: 'cleared',
					loaded_rotation: 'cleared',
					loaded_extension: 'cleared',
					inversion: 'hold',
					high_pressure: 'hold',
					impact: 'hold',
					deep_stability: 'cleared'
				},
				modifications: {},
				notes: null,
				reviewOn: reviewWindow().first
			})
		);
		const cleared = await limitsOf(client.clientId);
		expect(cleared.provisional).toBe(false);
		expect(cleared.categories.front_loaded.by).toBe('clinician');
	});

	it('her own record, self-checks, practice sessions and sharing each change the version', async () => {
		const client = await quietClient();
		const changes: Array<[string, () => Promise<unknown>]> = [
			[
				'record',
				() =>
					db()
						.update(clients)
						.set({ postnatalCleared: true })
						.where(eq(clients.id, client.clientId))
			],
			[
				'self-check',
				() =>
					db()
						.insert(selfChecks)
						.values({
							clientId: client.clientId,
							takenAt: new Date(),
							symptoms: ['late_bleeding'],
							adviceLevel: 'same_day'
						})
			],
			[
				'practice session',
				() =>
					db().insert(homePracticeSessions).values({
						clientId: client.clientId,
						doneAt: new Date(),
						feltOk: true,
						symptoms: []
					})
			],
			[
				'sharing',
				() =>
					db()
						.insert(selfCheckSharing)
						.values({ clientId: client.clientId, organisationId: studio.id, shared: true })
			]
		];
		for (const [what, change] of changes) {
			const before = await versionOf(client.clientId);
			await change();
			expect(await versionOf(client.clientId), what).not.toBe(before);
		}
		// Shared with her studio, the self-reported sign now stands in the studio's answer.
		expect((await limitsOf(client.clientId, 'shared')).seeDoctorFirst).toBe(true);
	});

	it('a version is never reused, even by a client made again with the same id', async () => {
		const client = await quietClient();
		const before = await versionOf(client.clientId);
		const [row] = await db().select().from(clients).where(eq(clients.id, client.clientId));
		await db().execute(sql`delete from clients where id = ${client.clientId}`);
		await db()
			.insert(clients)
			.values({ ...row!, limitsVersion: undefined });
		expect(await versionOf(client.clientId)).toBeGreaterThan(before);
	});
});
