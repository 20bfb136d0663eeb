import { beforeAll, describe, expect, it } from 'vitest';
import { getClient } from '../clients/service';
import { ProblemError } from '../http/problem';
import { getReferral } from '../referrals/service';
import {
	addConsent,
	addReferral,
	makeCast,
	makeClient,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { listOwnAccess } from './access';
import { exportOwnData, ownDataBundle } from './export';
import { Fhir } from 'fhir';

// The client's "who accessed my record" against the real database: reads by her instructor
// and by the physiotherapist appear with their organisation and role; her own reads are
// marked as hers; nothing about another client appears; pages do not overlap.

let studio: Org;
let clinic: Org;
let instructor: Person;
let physio: Person;
let her: ClientPerson;
let other: ClientPerson;

beforeAll(async () => {
	({ studio, clinic, instructor, physio } = await makeCast());
	her = await makeClient(studio, 'privacy');
	other = await makeClient(studio, 'neighbour');
	await addConsent(her, studio, clinic);
	const referralId = await addReferral({
		clientId: her.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		state: 'accepted',
		physioId: physio.userId
	});
	await getClient(instructor.caller, her.clientId);
	await getReferral(physio.caller, referralId);
	await getClient(instructor.caller, other.clientId);
	await getClient(instructor.caller, other.clientId);
});

describe('who accessed my record', () => {
	it('lists the instructor’s and the physio’s reads, with organisation and role, newest first', async () => {
		const { items } = await listOwnAccess(her.caller, { limit: 100 });
		const byInstructor = items.find(
			(i) => i.actor.name === instructor.name && i.action === 'client.read'
		);
		expect(byInstructor).toMatchObject({
			actor: { organisation: studio.name, role: 'instructor' },
			you: false,
			outcome: 'success',
			label: 'Opened a client record'
		});
		const byPhysio = items.find(
			(i) => i.actor.name === physio.name && i.action === 'referral.read'
		);
		expect(byPhysio?.actor).toMatchObject({ organisation: clinic.name, role: 'physiotherapist' });
		const times = items.map((i) => Date.parse(i.at));
		expect(times).toEqual([...times].sort((a, b) => b - a));
	});

	it('says nothing about another client, and marks her own reading of the list as hers', async () => {
		const first = await listOwnAccess(her.caller, { limit: 100 });
		const second = await listOwnAccess(her.caller, { limit: 100 });
		// The other client was read twice by the instructor; her list has one instructor read.
		expect(first.items.filter((i) => i.action === 'client.read' && !i.you)).toHaveLength(1);
		expect(second.items[0]).toMatchObject({ action: 'client.access_read', you: true });
		const theirs = await listOwnAccess(other.caller, { limit: 100 });
		expect(theirs.items.some((i) => i.actor.name === physio.name)).toBe(false);
	});

	it('pages by cursor without gaps or repeats', async () => {
		const all = (await listOwnAccess(her.caller, { limit: 100 })).items.slice(1);
		const seen: string[] = [];
		let cursor: string | undefined;
		// Each call adds her own read on top; pages walk back from where the first one began.
		const firstPage = await listOwnAccess(her.caller, { limit: 2 });
		seen.push(...firstPage.items.map((i) => `${i.at} ${i.action} ${i.actor.name}`));
		cursor = firstPage.nextCursor ?? undefined;
		while (cursor) {
			const page = await listOwnAccess(her.caller, { limit: 2, cursor });
			seen.push(...page.items.map((i) => `${i.at} ${i.action} ${i.actor.name}`));
			cursor = page.nextCursor ?? undefined;
		}
		expect(new Set(seen).size).toBe(seen.length);
		expect(seen.length).toBe(all.length + 2);
	});

	it('is not there for someone with no client record (404)', async () => {
		const refused = await listOwnAccess(instructor.caller, { limit: 10 }).catch((e: unknown) => e);
		expect(refused).toBeInstanceOf(ProblemError);
		expect((refused as ProblemError).toResponse().status).toBe(404);
	});

	it('exports her whole record as one document, logged, and nothing of another client', async () => {
		const data = await exportOwnData(her.caller);
		expect(data).toMatchObject({ format: 'seamwell.client-export', version: 1 });
		expect(data.client.id).toBe(her.clientId);
		expect(data.referrals).toHaveLength(1);
		expect(data.consents.grants.length).toBeGreaterThan(0);
		expect(data.accessLog.some((i) => i.action === 'client.exported' && i.you)).toBe(true);
		expect(JSON.stringify(data)).not.toContain(other.clientId);
		const refused = await exportOwnData(instructor.caller).catch((e: unknown) => e);
		expect((refused as ProblemError).toResponse().status).toBe(404);
	});

	it('her real record as a FHIR R4 Bundle validates (referral, consent, patient)', async () => {
		const data = await exportOwnData(her.caller);
		const bundle = ownDataBundle(data, 'https://seamwell.example');
		const types = bundle.entry.map((e) => e.resource.resourceType);
		expect(types).toEqual(expect.arrayContaining(['Patient', 'ServiceRequest', 'Task', 'Consent']));
		const result = new Fhir().validate(bundle);
		expect(result.messages.filter((m) => m.severity === 'error')).toEqual([]);
	});
});
