import { randomUUID } from 'node:crypto';
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Actor } from '../actor';
import type { Caller } from '../context';
import { db } from '../db';
import {
	accessLog,
	clients,
	memberships,
	organisations,
	outbox,
	screenings,
	users
} from '../db/schema';
import { ProblemError } from '../http/problem';
import { formatDate } from '$lib/clients/labels';
import { screeningInputSchema } from '$lib/clients/schemas';
import {
	createClient,
	getClient,
	getOwnRecord,
	inviteClientToSignIn,
	listClients,
	listScreenings,
	recordScreening,
	updateClient
} from './service';

// The client services against the real database: two studios that must not see each other,
// the access-log rows every read and write leaves, and the intake-consent gate.

async function person(label: string): Promise<{ id: string; email: string }> {
	const email = `${label}-${randomUUID().slice(0, 8)}@test.example`;
	const [row] = await db().insert(users).values({ email, name: label }).returning({ id: users.id });
	return { id: row!.id, email };
}

async function studio(name: string): Promise<string> {
	const [row] = await db()
		.insert(organisations)
		.values({ name, kind: 'studio' })
		.returning({ id: organisations.id });
	return row!.id;
}

function callerFor(
	user: { id: string; email: string },
	orgs: Array<{ id: string; role: 'instructor' | 'admin' }>,
	clientId: string | null = null
): Caller {
	const actor: Actor = {
		userId: user.id,
		email: user.email,
		name: null,
		memberships: orgs.map((o) => ({
			organisationId: o.id,
			organisationName: 'Test studio',
			kind: 'studio',
			role: o.role
		})),
		clientId,
		activeOrganisationId: orgs[0]?.id ?? null
	};
	return {
		actor,
		access: {
			userId: user.id,
			role: orgs[0]?.role ?? (clientId ? 'client' : null),
			organisationId: orgs[0]?.id ?? null,
			address: '127.0.0.1',
			userAgent: 'vitest'
		}
	};
}

async function logFor(userId: string) {
	return db()
		.select()
		.from(accessLog)
		.where(eq(accessLog.actorUserId, userId))
		.orderBy(accessLog.id);
}

async function expectProblem(work: Promise<unknown>, slug: string): Promise<ProblemError> {
	try {
		await work;
	} catch (error) {
		expect(error).toBeInstanceOf(ProblemError);
		expect((error as ProblemError).slug).toBe(slug);
		return error as ProblemError;
	}
	throw new Error(`expected a ${slug} problem`);
}

const site = (widthFingers: number) => ({
	widthFingers,
	depth: 'shallow',
	tension: 'firm',
	doming: false
});
const weeksAgo = (weeks: number) =>
	new Date(Date.now() - weeks * 7 * 86_400_000).toISOString().slice(0, 10);

let studioA: string;
let studioB: string;
let tess: Caller;
let priya: Caller;
let adminOnly: Caller;

beforeAll(async () => {
	studioA = await studio('Studio A');
	studioB = await studio('Studio B');
	const a = await person('tess');
	const b = await person('priya');
	const c = await person('admin');
	await db()
		.insert(memberships)
		.values([
			{ userId: a.id, organisationId: studioA, role: 'instructor' },
			{ userId: b.id, organisationId: studioB, role: 'instructor' },
			{ userId: c.id, organisationId: studioA, role: 'admin' }
		]);
	tess = callerFor(a, [{ id: studioA, role: 'instructor' }]);
	priya = callerFor(b, [{ id: studioB, role: 'instructor' }]);
	adminOnly = callerFor(c, [{ id: studioA, role: 'admin' }]);
});

async function newClient(caller: Caller, name: string, withConsent = true) {
	return createClient(caller, {
		name,
		email: null,
		stage: 'postpartum',
		birthDate: weeksAgo(12),
		delivery: 'vaginal',
		births: 1,
		multiples: false,
		postnatalCheckOn: weeksAgo(5),
		postnatalCleared: true,
		// She agreed when she joined, at the birth: her history may be entered from then on.
		intakeConsent: withConsent ? { at: new Date(weeksAgo(12)), method: 'in_person' } : null
	});
}

describe('client records between two studios', () => {
	it('an instructor of another studio gets 404 for the record, and the refusal is logged', async () => {
		const { id } = await newClient(tess, 'Isolde Alpha');
		await expect(getClient(tess, id)).resolves.toMatchObject({ id, name: 'Isolde Alpha' });

		await expectProblem(getClient(priya, id), 'not-found');
		await expectProblem(updateClient(priya, id, { name: 'Taken over' }), 'not-found');
		await expectProblem(
			recordScreening(
				priya,
				id,
				screeningInputSchema.parse({
					takenAt: new Date().toISOString(),
					sites: { above_navel: site(1), at_navel: site(1), below_navel: site(1) }
				})
			),
			'not-found'
		);
		await expectProblem(listScreenings(priya, id, { limit: 10 }), 'not-found');
		await expectProblem(getClient(adminOnly, id), 'not-found');

		const refusals = (await logFor(priya.actor.userId)).filter((r) => r.targetId === id);
		expect(refusals.map((r) => [r.action, r.outcome])).toEqual([
			['client.read', 'refused'],
			['client.updated', 'refused'],
			['screening.recorded', 'refused'],
			['screening.read', 'refused']
		]);
		expect(refusals.every((r) => r.subjectKey !== null)).toBe(true);
		const [stored] = await db().select().from(clients).where(eq(clients.id, id));
		expect(stored!.name).toBe('Isolde Alpha');
	});

	it('an unknown id answers the same 404, with a refusal logged and no subject key', async () => {
		const ghost = randomUUID();
		await expectProblem(getClient(priya, ghost), 'not-found');
		const [row] = (await logFor(priya.actor.userId)).filter((r) => r.targetId === ghost);
		expect(row).toMatchObject({ action: 'client.read', outcome: 'refused', subjectKey: null });
	});

	it('lists only her own studio, one access-log row per client shown', async () => {
		const mine = await newClient(tess, `Zelda ${randomUUID().slice(0, 4)}`);
		const theirs = await newClient(priya, `Zelda ${randomUUID().slice(0, 4)}`);
		const page = await listClients(tess, { search: 'Zelda', sort: 'name', limit: 25 });
		expect(page.items.map((c) => c.id)).toEqual([mine.id]);
		const other = await listClients(priya, { search: 'zelda', sort: 'name', limit: 25 });
		expect(other.items.map((c) => c.id)).toEqual([theirs.id]);

		const rows = (await logFor(tess.actor.userId)).filter((r) => r.action === 'client.listed');
		expect(rows.filter((r) => r.targetId === mine.id)).toHaveLength(1);
		expect(rows.some((r) => r.targetId === theirs.id)).toBe(false);
	});

	it('a person who teaches nowhere may not list clients (403, logged)', async () => {
		await expectProblem(listClients(adminOnly, { sort: 'name', limit: 5 }), 'forbidden');
		const rows = await logFor(adminOnly.actor.userId);
		expect(rows.at(-1)).toMatchObject({ action: 'client.listed', outcome: 'refused' });
	});

	it('pages through the list with cursors, without repeats', async () => {
		const tag = randomUUID().slice(0, 6);
		for (const n of ['C', 'A', 'B']) await newClient(tess, `Pager ${tag} ${n}`);
		const first = await listClients(tess, { search: `Pager ${tag}`, sort: 'name', limit: 2 });
		expect(first.items.map((c) => c.name)).toEqual([`Pager ${tag} A`, `Pager ${tag} B`]);
		expect(first.nextCursor).not.toBeNull();
		const second = await listClients(tess, {
			search: `Pager ${tag}`,
			sort: 'name',
			limit: 2,
			cursor: first.nextCursor!
		});
		expect(second.items.map((c) => c.name)).toEqual([`Pager ${tag} C`]);
		expect(second.nextCursor).toBeNull();
	});

	it('a forged cursor is a 422 on /cursor, never a database error', async () => {
		const id = randomUUID();
		const forge = (value: unknown) => Buffer.from(JSON.stringify(value)).toString('base64url');
		const forged = [
			// A text key where the sort wants a moment.
			{ sort: 'lastScreenedAt' as const, cursor: forge({ k: 'zzz', id }) },
			{ sort: 'lastScreenedAt' as const, cursor: forge({ k: '2026-02-31T00:00:00.000Z', id }) },
			{ sort: 'lastScreenedAt' as const, cursor: forge({ k: 7, id }) },
			// PostgreSQL cannot take a NUL in text.
			{ sort: 'name' as const, cursor: forge({ k: 'A\u0000B', id }) },
			{ sort: 'name' as const, cursor: forge({ k: 'A', id: 'not-a-uuid' }) },
			{ sort: 'name' as const, cursor: forge({ k: 'A', id, extra: 1 }) },
			// Not base64url, not JSON, not UTF-8.
			{ sort: 'name' as const, cursor: '%%%' },
			{ sort: 'name' as const, cursor: Buffer.from('{"k":').toString('base64url') },
			{ sort: 'name' as const, cursor: Buffer.from([0xff, 0xfe, 0x7b]).toString('base64url') }
		];
		for (const { sort, cursor } of forged) {
			const problem = await expectProblem(
				listClients(tess, { sort, limit: 5, cursor }),
				'validation-failed'
			);
			expect(problem.init.errors).toEqual([{ pointer: '/cursor', message: 'unknown cursor' }]);
		}
	});

	it('pages by when she was last screened with the cursor it hands out', async () => {
		const tag = randomUUID().slice(0, 6);
		for (const n of ['A', 'B']) await newClient(tess, `Dated ${tag} ${n}`);
		const first = await listClients(tess, {
			search: `Dated ${tag}`,
			sort: 'lastScreenedAt',
			limit: 1
		});
		const second = await listClients(tess, {
			search: `Dated ${tag}`,
			sort: 'lastScreenedAt',
			limit: 1,
			cursor: first.nextCursor!
		});
		expect([...first.items, ...second.items].map((c) => c.name).sort()).toEqual([
			`Dated ${tag} A`,
			`Dated ${tag} B`
		]);
	});
});

describe('screenings', () => {
	it('needs intake consent first: 409, logged, nothing written', async () => {
		const { id } = await newClient(tess, 'Consent Pending', false);
		const input = screeningInputSchema.parse({
			takenAt: new Date().toISOString(),
			sites: { above_navel: site(1), at_navel: site(2.5), below_navel: site(1) }
		});
		await expectProblem(recordScreening(tess, id, input), 'intake-consent-required');
		expect(await db().select().from(screenings).where(eq(screenings.clientId, id))).toEqual([]);
		const [refused] = (await logFor(tess.actor.userId)).filter(
			(r) => r.targetId === id && r.action === 'screening.recorded'
		);
		expect(refused?.outcome).toBe('refused');

		await updateClient(tess, id, { intakeConsent: { at: new Date(), method: 'signed_form' } });
		const recorded = await recordScreening(tess, id, input);
		// Sperstad JB et al. 2016 — 2.5 finger widths at the navel is past ≥ 2: refer to a physio
		expect(recorded.outcome).toBe('refer');
		expect(recorded.reasons[0]).toMatchObject({ site: 'at_navel', referTo: 'physio' });
		expect(recorded.weeksPostpartum).toBe(12);

		const [stored] = await db().select().from(screenings).where(eq(screenings.id, recorded.id));
		expect(stored).toMatchObject({
			outcome: 'refer',
			weeksPostpartum: 12,
			postnatalCheckDone: true
		});
		expect(stored!.rulesVersion).toMatch(/^seamwell-screening-/);
		const [client] = await db().select().from(clients).where(eq(clients.id, id));
		expect(client!.lastOutcome).toBe('refer');

		const needing = await listClients(tess, { needs: 'referral', sort: 'name', limit: 100 });
		expect(needing.items.map((c) => c.id)).toContain(id);
		const log = await db()
			.select()
			.from(accessLog)
			.where(and(eq(accessLog.targetId, recorded.id), eq(accessLog.action, 'screening.recorded')));
		expect(log).toHaveLength(1);
	});

	it('refuses a screening dated before the pregnancy could be dated, writing nothing', async () => {
		const { id } = await createClient(tess, {
			name: 'Early Date',
			stage: 'pregnant',
			dueDate: weeksAgo(-10),
			// Consent before the screening date, so the date of the pregnancy is what fails.
			intakeConsent: { at: new Date(weeksAgo(45)), method: 'online' }
		});
		const input = screeningInputSchema.parse({
			takenAt: weeksAgo(40),
			sites: { above_navel: site(1), at_navel: site(1), below_navel: site(1) }
		});
		const problem = await expectProblem(recordScreening(tess, id, input), 'validation-failed');
		expect(problem.init.errors).toEqual([
			{ pointer: '/takenAt', message: 'is more than 40 weeks before her due date' }
		]);
		expect(await db().select().from(screenings).where(eq(screenings.clientId, id))).toEqual([]);
	});

	it('refuses a screening dated before her intake consent (422, /takenAt); her consent day is fine', async () => {
		const { id } = await newClient(tess, 'Consent Later', false);
		const consentDay = weeksAgo(3);
		const consentAt = new Date(`${consentDay}T15:00:00Z`);
		await updateClient(tess, id, { intakeConsent: { at: consentAt, method: 'in_person' } });
		const on = (takenAt: string) =>
			screeningInputSchema.parse({
				takenAt,
				sites: { above_navel: site(1), at_navel: site(1), below_navel: site(1) }
			});
		const dayBefore = new Date(consentAt.getTime() - 86_400_000).toISOString().slice(0, 10);

		const problem = await expectProblem(
			recordScreening(tess, id, on(dayBefore)),
			'validation-failed'
		);
		expect(problem.toResponse().status).toBe(422);
		expect(problem.init.errors).toEqual([
			{
				pointer: '/takenAt',
				message: `must not be before her intake consent on ${formatDate(consentAt)}`
			}
		]);
		expect(await db().select().from(screenings).where(eq(screenings.clientId, id))).toEqual([]);
		const [untouched] = await db().select().from(clients).where(eq(clients.id, id));
		expect(untouched!.lastScreenedAt).toBeNull();

		// Earlier in the day than the consent, but the same day: recorded.
		const sameDay = await recordScreening(tess, id, on(`${consentDay}T09:00:00Z`));
		const stored = await db().select().from(screenings).where(eq(screenings.clientId, id));
		expect(stored.map((s) => s.id)).toEqual([sameDay.id]);
	});

	it('lists newest first with the trend per site, and the client sees only her own', async () => {
		const { id } = await newClient(tess, 'Trend Person');
		const at = (weeks: number, width: number) =>
			recordScreening(
				tess,
				id,
				screeningInputSchema.parse({
					takenAt: weeksAgo(weeks),
					sites: { above_navel: site(1), at_navel: site(width), below_navel: site(1) }
				})
			);
		await at(6, 3);
		await at(4, 2.5);
		await at(2, 1.5);
		const page = await listScreenings(tess, id, { limit: 2 });
		expect(page.items.map((s) => s.sites.at_navel.widthFingers)).toEqual([1.5, 2.5]);
		expect(page.nextCursor).not.toBeNull();
		// trade practice — a change of more than half a finger width is not steady
		expect(page.trend.at_navel).toMatchObject({
			direction: 'improving',
			changeSinceFirst: -1.5,
			changeSincePrevious: -1,
			jump: { direction: 'narrowed', by: 1 }
		});
		expect(page.trend.at_navel.jump?.since.slice(0, 10)).toBe(weeksAgo(4));
		expect(page.trend.above_navel.direction).toBe('steady');
		expect(page.trend.above_navel.jump).toBeNull();
		const rest = await listScreenings(tess, id, { limit: 2, cursor: page.nextCursor! });
		expect(rest.items.map((s) => s.sites.at_navel.widthFingers)).toEqual([3]);

		const her = await person('her');
		await db().update(clients).set({ userId: her.id }).where(eq(clients.id, id));
		const herself = callerFor(her, [], id);
		const own = await getOwnRecord(herself);
		expect(own.client.id).toBe(id);
		expect(own.history.items).toHaveLength(3);
		await expect(getClient(herself, id)).resolves.toMatchObject({ id });
		const { id: other } = await newClient(tess, 'Someone Else');
		await expectProblem(getClient(herself, other), 'not-found');
		await expectProblem(
			recordScreening(
				herself,
				id,
				screeningInputSchema.parse({
					takenAt: weeksAgo(1),
					sites: { above_navel: site(1), at_navel: site(1), below_navel: site(1) }
				})
			),
			'not-found'
		);
	});
});

describe('inviting a client to sign in', () => {
	it('links a person with her address to the record and queues a mail', async () => {
		const email = `invitee-${randomUUID().slice(0, 8)}@test.example`;
		const { id } = await createClient(tess, {
			name: 'Invitee',
			email,
			stage: 'pregnant',
			dueDate: weeksAgo(-12)
		});
		await expect(inviteClientToSignIn(tess, id)).resolves.toEqual({ sentTo: email });
		const [client] = await db().select().from(clients).where(eq(clients.id, id));
		const [user] = await db().select().from(users).where(eq(users.email, email));
		expect(client!.userId).toBe(user!.id);
		const mails = await db().select().from(outbox).where(eq(outbox.to, email));
		expect(mails.map((m) => m.kind)).toEqual(['client.invitation']);
		// A mail carries no health details: nothing says what the record is about.
		const [mail] = mails;
		const words = [mail!.subject, mail!.text, mail!.html ?? ''].join('\n').toLowerCase();
		expect(words).toContain('keeps your record in seamwell');
		for (const health of ['midline', 'screening', 'abdominal', 'diastasis', 'separation']) {
			expect(words, health).not.toContain(health);
		}
		await expectProblem(inviteClientToSignIn(priya, id), 'not-found');
	});
});
