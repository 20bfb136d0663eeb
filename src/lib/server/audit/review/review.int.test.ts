import { and, eq, max } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../db';
import { accessLog, clients, documents } from '../../db/schema';
import {
	addReferral,
	makeClient,
	makeMember,
	makeOrg,
	problemOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../../tests/support/referral-fixtures';
import type { Caller } from '../../context';
import { recordAccess, type AccessEvent } from '../writer';
import { reviewQuery, type ReviewQuery } from './filters';
import { exportAccessEvents, listAccessEvents, getAccessEvent } from './service';

// The admin's review against the real database: who sees which events, every filter, keyset
// paging while rows arrive, and the CSV export. Each run makes its own organisations, so the
// shared test database's other rows never fall in scope.

const q = (input: Record<string, string> = {}): ReviewQuery => reviewQuery.parse(input);

async function act(person: Person, event: AccessEvent): Promise<number> {
	await recordAccess(db(), person.caller.access, event);
	const [row] = await db()
		.select({ id: max(accessLog.id) })
		.from(accessLog)
		.where(eq(accessLog.actorUserId, person.userId));
	return row!.id!;
}

async function ids(caller: Caller, input: Record<string, string> = {}) {
	const page = await listAccessEvents(caller, q({ limit: '200', ...input }));
	return page.items.map((i) => i.id);
}

let studio: Org, clinic: Org, otherStudio: Org;
let studioAdmin: Person, clinicAdmin: Person, otherAdmin: Person;
let instructor: Person, physio: Person, stranger: Person;
let hana: ClientPerson, formula: ClientPerson;
let sent: string, draft: string, documentId: string;
const e: Record<string, number> = {};

beforeAll(async () => {
	studio = await makeOrg('studio', 'Review studio');
	clinic = await makeOrg('clinic', 'Review clinic');
	otherStudio = await makeOrg('studio', 'Other studio');
	studioAdmin = await makeMember(studio, 'admin');
	clinicAdmin = await makeMember(clinic, 'admin');
	otherAdmin = await makeMember(otherStudio, 'admin');
	instructor = await makeMember(studio, 'instructor');
	physio = await makeMember(clinic, 'physiotherapist');
	stranger = await makeMember(otherStudio, 'instructor', 'stranger');
	hana = await makeClient(studio, 'hana');
	formula = await makeClient(studio, 'formula');
	formula.name = '=HYPERLINK("x")';
	await db().update(clients).set({ name: formula.name }).where(eq(clients.id, formula.clientId));
	sent = await addReferral({
		clientId: hana.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		state: 'sent'
	});
	draft = await addReferral({
		clientId: formula.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		state: 'draft'
	});
	documentId = crypto.randomUUID();
	await db()
		.insert(documents)
		.values({
			id: documentId,
			referralId: sent,
			fileName: 'notes.pdf',
			storageKey: `test/${documentId}`,
			sha256: 'a'.repeat(64),
			sizeBytes: 1000,
			pages: 1,
			uploadedBy: physio.userId
		});

	const client = (id: string) => ({ type: 'client', id });
	e.instructorRead = await act(instructor, {
		action: 'client.read',
		outcome: 'success',
		target: client(hana.clientId),
		clientId: hana.clientId
	});
	e.physioRead = await act(physio, {
		action: 'referral.read',
		outcome: 'success',
		target: { type: 'referral', id: sent },
		clientId: hana.clientId
	});
	e.strangerRefused = await act(stranger, {
		action: 'access.denied',
		outcome: 'refused',
		target: client(hana.clientId),
		clientId: hana.clientId
	});
	e.draftRead = await act(instructor, {
		action: 'referral.read',
		outcome: 'success',
		target: { type: 'referral', id: draft },
		clientId: formula.clientId
	});
	e.documentByStranger = await act(stranger, {
		action: 'document.downloaded',
		outcome: 'refused',
		target: { type: 'document', id: documentId }
	});
	e.formulaRead = await act(instructor, {
		action: 'client.read',
		outcome: 'success',
		target: client(formula.clientId),
		clientId: formula.clientId
	});
});

describe('scope', () => {
	it('a studio admin sees her members and anyone on her clients and referrals', async () => {
		const seen = await ids(studioAdmin.caller, { action: '' });
		for (const key of [
			'instructorRead',
			'physioRead',
			'strangerRefused',
			'draftRead',
			'formulaRead'
		]) {
			expect(seen, key).toContain(e[key]);
		}
		expect(seen).not.toContain(e.documentByStranger);
	});

	it('a clinic admin sees its referrals (not drafts), its documents and its members', async () => {
		const seen = await ids(clinicAdmin.caller);
		expect(seen).toContain(e.physioRead);
		expect(seen).toContain(e.documentByStranger);
		expect(seen).not.toContain(e.instructorRead);
		expect(seen).not.toContain(e.draftRead);
		expect(seen).not.toContain(e.strangerRefused);
	});

	it('the other studio’s admin sees only her own member, never our client’s name', async () => {
		const page = await listAccessEvents(otherAdmin.caller, q({ limit: '200' }));
		const mine = page.items.filter((i) => Object.values(e).includes(i.id));
		expect(mine.map((i) => i.id).sort()).toEqual([e.strangerRefused, e.documentByStranger].sort());
		const refused = mine.find((i) => i.id === e.strangerRefused)!;
		expect(refused.client).toEqual({ id: null, name: null });
	});

	it('names the client where her organisation holds her', async () => {
		const page = await listAccessEvents(studioAdmin.caller, q({ target: `referral:${sent}` }));
		expect(page.items).toHaveLength(1);
		expect(page.items[0]).toMatchObject({
			id: e.physioRead,
			action: 'referral.read',
			label: 'Read a referral',
			actor: {
				id: physio.userId,
				name: physio.name,
				role: 'physiotherapist',
				organisationId: clinic.id
			},
			target: { type: 'referral', id: sent },
			client: { id: hana.clientId, name: hana.name },
			outcome: 'success',
			address: '198.51.100.20'
		});
	});

	it('instructors, physiotherapists and clients get 404, and the refusal is logged', async () => {
		for (const person of [instructor, physio, hana]) {
			expect(await statusOf(listAccessEvents(person.caller, q()))).toBe(404);
			const [row] = await db()
				.select()
				.from(accessLog)
				.where(and(eq(accessLog.actorUserId, person.userId), eq(accessLog.action, 'audit.read')));
			expect(row).toMatchObject({ outcome: 'refused' });
		}
	});

	it('an event outside her scope is 404 by id too, and logged', async () => {
		expect(await statusOf(getAccessEvent(clinicAdmin.caller, e.instructorRead!))).toBe(404);
		expect((await getAccessEvent(studioAdmin.caller, e.instructorRead!)).id).toBe(e.instructorRead);
		const refusals = await db()
			.select()
			.from(accessLog)
			.where(and(eq(accessLog.actorUserId, clinicAdmin.userId), eq(accessLog.outcome, 'refused')));
		expect(refusals.map((r) => r.targetId)).toContain(String(e.instructorRead));
	});

	it('a client her organisation does not hold is 404 as a filter, logged', async () => {
		const problem = await problemOf(
			listAccessEvents(otherAdmin.caller, q({ client: hana.clientId }))
		);
		expect(problem.status).toBe(404);
		const rows = await db()
			.select()
			.from(accessLog)
			.where(and(eq(accessLog.actorUserId, otherAdmin.userId), eq(accessLog.outcome, 'refused')));
		expect(rows.some((r) => r.targetId === hana.clientId)).toBe(true);
	});
});

describe('filters', () => {
	it.each([
		['actor', () => ({ actor: physio.userId }), () => [e.physioRead]],
		['client', () => ({ client: formula.clientId }), () => [e.formulaRead, e.draftRead]],
		['action', () => ({ action: 'access.denied' }), () => [e.strangerRefused]],
		['outcome', () => ({ outcome: 'refused' }), () => [e.strangerRefused]],
		[
			'target',
			() => ({ target: `client:${hana.clientId}` }),
			() => [e.strangerRefused, e.instructorRead]
		],
		[
			'action and client',
			() => ({ action: 'client.read', client: hana.clientId }),
			() => [e.instructorRead]
		]
	])('by %s', async (_name, input, expected) => {
		const seen = (await ids(studioAdmin.caller, input())).filter((id) =>
			Object.values(e).includes(id)
		);
		expect(seen).toEqual(expected());
	});

	it('by date range: today holds them all, tomorrow none, yesterday none', async () => {
		const day = (offset: number) =>
			new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);
		const today = await ids(studioAdmin.caller, { from: day(0), to: day(0) });
		expect(today).toContain(e.instructorRead);
		expect(await ids(studioAdmin.caller, { from: day(1) })).toEqual([]);
		const before = await ids(studioAdmin.caller, { to: day(-1) });
		expect(before).not.toContain(e.instructorRead);
	});
});

describe('keyset paging', () => {
	it('has no gaps or repeats while rows are being added', async () => {
		const all = await ids(studioAdmin.caller, { actor: instructor.userId });
		const seen: number[] = [];
		let cursor: string | null = null;
		do {
			const page = await listAccessEvents(
				studioAdmin.caller,
				q({ actor: instructor.userId, limit: '1', ...(cursor ? { cursor } : {}) })
			);
			seen.push(...page.items.map((i) => i.id));
			cursor = page.nextCursor;
			// A newer event arrives between pages: it belongs before the first page, not in this walk.
			await act(instructor, { action: 'client.listed', outcome: 'success' });
		} while (cursor);
		expect(seen).toEqual(all);
		expect(new Set(seen).size).toBe(seen.length);
	});

	it('refuses a cursor it did not hand out (422 naming /cursor)', async () => {
		const problem = await problemOf(listAccessEvents(studioAdmin.caller, q({ cursor: 'bm9wZQ' })));
		expect(problem.status).toBe(422);
		expect(problem.errors?.[0]?.pointer).toBe('/cursor');
	});
});

async function readAll(stream: ReadableStream<Uint8Array>) {
	return new Response(stream).text();
}

describe('CSV export', () => {
	it('quotes every cell and neutralises a formula-looking name; logs the export once', async () => {
		const file = await exportAccessEvents(studioAdmin.caller, q({ client: formula.clientId }));
		expect(file.filename).toMatch(
			/^access-log_review-studio-[a-z0-9-]+_start_to_\d{4}-\d{2}-\d{2}\.csv$/
		);
		const text = await readAll(file.stream);
		const lines = text.split('\r\n');
		expect(lines[0]).toBe(
			'"id","at","actor_id","actor_name","actor_role","actor_organisation","action","action_label","target_type","target_id","client","outcome","address"'
		);
		expect(text).toContain(`"'${formula.name.replaceAll('"', '""')}"`);
		expect(text).not.toMatch(/(^|,)"=/m);
		expect(lines.filter((l) => l.startsWith(`"${e.formulaRead}"`))).toHaveLength(1);
		const logged = await db()
			.select()
			.from(accessLog)
			.where(
				and(eq(accessLog.actorUserId, studioAdmin.userId), eq(accessLog.action, 'audit.exported'))
			);
		expect(logged).toHaveLength(1);
		expect(logged[0]).toMatchObject({
			outcome: 'success',
			targetType: 'audit_filter',
			targetId: 'client=%28subject+key%29'
		});
		expect(logged[0]!.subjectKey).not.toBeNull();
	});

	it('streams: the first rows arrive before the last batch is queried', async () => {
		for (let i = 0; i < 9; i++)
			await act(instructor, { action: 'client.listed', outcome: 'success' });
		const batches: number[] = [];
		const file = await exportAccessEvents(studioAdmin.caller, q({ actor: instructor.userId }), {
			batchSize: 2,
			onBatch: (n) => batches.push(n)
		});
		const reader = file.stream.getReader();
		const header = await reader.read();
		expect(new TextDecoder().decode(header.value)).toMatch(/^"id","at"/);
		const first = await reader.read();
		expect(new TextDecoder().decode(first.value).split('\r\n').filter(Boolean)).toHaveLength(2);
		const queriedWhenFirstRowsArrived = batches.length;
		let rest = '';
		for (;;) {
			const chunk = await reader.read();
			if (chunk.done) break;
			rest += new TextDecoder().decode(chunk.value);
		}
		expect(queriedWhenFirstRowsArrived).toBeLessThanOrEqual(2);
		expect(batches.length).toBeGreaterThanOrEqual(6);
		expect(rest.split('\r\n').filter(Boolean).length).toBeGreaterThanOrEqual(9);
	});
});
