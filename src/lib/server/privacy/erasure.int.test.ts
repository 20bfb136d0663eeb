import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { clearanceSchema, reviewWindow } from '$lib/clearance/schemas';
import { validPdf } from '../../../../tests/fixtures/pdf';
import { sealPending } from '../audit';
import { verifyChain } from '../audit/verify';
import { setClearance } from '../clearance/clearance';
import { getClient } from '../clients/service';
import { db } from '../db';
import { accessLog, clients, outbox, plans, referrals, sessions, subjectKeys } from '../db/schema';
import { downloadDocument, uploadDocument } from '../documents/service';
import { erasureDueOn } from '../../domain/erasure';
import { resolveSession } from '../people/sessions';
import { createPlan } from '../plans/service';
import {
	addConsent,
	addScreening,
	makeCast,
	makeClient,
	makeMember,
	makeOrg,
	problemOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { getReferral, listReferrals, openReferral, transitionReferral } from '../referrals/service';
import { objectExists } from '../storage';
import { ERASURE_RULES } from './erasure-rules';
import {
	decideErasure,
	getErasureRequest,
	listErasureRequests,
	listOwnErasureRequests,
	requestErasure
} from './erasure';

// Erasure end to end against the real PostgreSQL and s3rver. The rules checked are GDPR
// Art. 17 (erasure), 17(3)(b)/(c) (a clinic's duty to keep records), 12(3) (one month) and
// Seamwell's own design of the access log (DESIGN.md): no row lost, the chain verifies, and
// nothing leads from it to her once her subject key is gone.

let studio: Org;
let clinic: Org;
let otherClinic: Org;
let instructor: Person;
let physio: Person;
let admin: Person;
let otherAdmin: Person;

beforeAll(async () => {
	({ studio, clinic, otherClinic, instructor, physio } = await makeCast());
	admin = await makeMember(studio, 'admin');
	otherAdmin = await makeMember(await makeOrg('studio', 'other studio'), 'admin');
});

/** A client with history, full consent, a referral the clinic accepted (with a document and a
 * clearance), a draft never sent, a plan place, and an open session. */
async function fullClient(label: string) {
	const her = await makeClient(studio, label);
	await addScreening(her.clientId, new Date('2025-03-01T10:00:00Z'), [2, 2.5, 2]);
	await addScreening(her.clientId, new Date('2025-04-01T10:00:00Z'), [2.5, 3, 2]);
	await addConsent(her, studio, clinic);
	const draft = (clinicId: string, physioId: string | null) =>
		openReferral(instructor.caller, {
			clientId: her.clientId,
			clinicId,
			physioId,
			reason: 'Three finger widths at the navel with doming (invented).',
			urgency: 'routine',
			redFlags: []
		});
	const { id: referralId } = await draft(clinic.id, physio.userId);
	await transitionReferral(instructor.caller, referralId, { to: 'sent', reason: null });
	await transitionReferral(physio.caller, referralId, { to: 'accepted', reason: null });
	const document = await uploadDocument(physio.caller, referralId, {
		bytes: await validPdf(),
		fileName: 'assessment.pdf',
		share: 'studio',
		summary: 'Keep loaded flexion on hold for now (invented).'
	});
	await setClearance(
		physio.caller,
		her.clientId,
		clearanceSchema.parse({
			categories: {
				loaded_flexion: 'hold',
				long_lever: 'hold',
				front_loaded: 'modify',
				loaded_rotation: 'cleared',
				loaded_extension: 'cleared',
				inversion: 'hold',
				high_pressure: 'hold',
				impact: 'hold',
				deep_stability: 'cleared'
			},
			modifications: { front_loaded: 'Plank on the forearms against a bench' },
			notes: null,
			reviewOn: reviewWindow().first
		})
	);
	const { id: draftId } = await draft(otherClinic.id, null); // never sent
	const token = randomUUID();
	await db()
		.insert(sessions)
		.values({
			sessionToken: token,
			userId: her.userId,
			expires: new Date(Date.now() + 86_400_000)
		});
	return { her, referralId, documentId: document.id, draftId, token };
}

/**
 * Every row of a table that names the person by id or address, read as text (whatever the
 * column, JSON included). The outbox's confirmation of the erasure is the one row allowed to
 * hold her address, until it is sent.
 */
async function rowsNaming(table: string, needles: string[]): Promise<number> {
	let total = 0;
	const unsentConfirmation =
		table === 'outbox' ? sql`and not (t.kind = 'erasure.approved' and t.state = 'pending')` : sql``;
	for (const needle of needles) {
		const result = await db().execute<{ n: number }>(
			sql`select count(*)::int as n from ${sql.identifier(table)} t
				where t::text ilike ${`%${needle}%`} ${unsentConfirmation}`
		);
		total += result.rows[0]!.n;
	}
	return total;
}

describe('asking', () => {
	it('answers 201 with the due day one month later, 409 on a second open request', async () => {
		const her = await makeClient(studio, 'asks');
		const before = new Date();
		const created = await requestErasure(her.caller);
		expect(created.dueOn).toBe(erasureDueOn(before));
		const again = await problemOf(requestErasure(her.caller));
		expect(again.status).toBe(409);
		expect(again.detail).toContain(created.dueOn);
		const own = await listOwnErasureRequests(her.caller);
		expect(own).toHaveLength(1);
		expect(own[0]).toMatchObject({ id: created.id, state: 'open', overdue: false });
		// Her studio's admins hear of it; nobody else.
		const mail = await db().select().from(outbox).where(eq(outbox.to, admin.email));
		expect(mail.some((m) => m.kind === 'erasure.requested' && m.text.includes(created.id))).toBe(
			true
		);
	});

	it('is refused to someone who is not a client (404)', async () => {
		expect(await statusOf(requestErasure(instructor.caller))).toBe(404);
	});
});

describe('deciding', () => {
	it('belongs to the studio’s admins: an instructor is refused, another studio’s admin gets 404', async () => {
		const her = await makeClient(studio, 'scope');
		const { id } = await requestErasure(her.caller);
		expect(await statusOf(listErasureRequests(instructor.caller))).toBe(403);
		expect(await statusOf(getErasureRequest(otherAdmin.caller, id))).toBe(404);
		expect(await statusOf(decideErasure(otherAdmin.caller, id, { decision: 'approve' }))).toBe(404);
		expect((await listErasureRequests(otherAdmin.caller)).map((r) => r.id)).not.toContain(id);
		const listed = await listErasureRequests(admin.caller, { state: 'open' });
		expect(listed.find((r) => r.id === id)?.client?.id).toBe(her.clientId);
	});

	it('declining needs a reason (422); a declined request leaves everything and she reads why', async () => {
		const { her, referralId } = await fullClient('declined');
		const { id } = await requestErasure(her.caller);
		const noReason = await problemOf(decideErasure(admin.caller, id, { decision: 'decline' }));
		expect(noReason.status).toBe(422);
		expect(noReason.errors?.[0]?.pointer).toBe('/reason');

		const needles = [her.clientId, her.userId, her.email];
		const counts = async () =>
			Object.fromEntries(
				await Promise.all(
					Object.keys(ERASURE_RULES)
						// The log grows by design; the outbox gains the mail that tells her.
						.filter((t) => ERASURE_RULES[t as keyof typeof ERASURE_RULES].rule !== 'log')
						.filter((t) => t !== 'outbox')
						.map(async (t) => [t, await rowsNaming(t, needles)] as const)
				)
			);
		const before = await counts();
		const reason = 'She has an unpaid course contract we must keep until June (invented).';
		const answer = await decideErasure(admin.caller, id, { decision: 'decline', reason });
		expect(answer).toMatchObject({ state: 'declined', reason });
		const told = await db().select().from(outbox).where(eq(outbox.to, her.email));
		expect(told.some((m) => m.kind === 'erasure.declined')).toBe(true);
		const after = await counts();
		// Only the request row itself changed (its state); every other table names her as before.
		expect(after).toEqual(before);
		expect((await getClient(instructor.caller, her.clientId)).id).toBe(her.clientId);
		expect((await getReferral(instructor.caller, referralId)).clientId).toBe(her.clientId);
		const own = await listOwnErasureRequests(her.caller);
		expect(own[0]).toMatchObject({ state: 'declined', reason });
		expect(await statusOf(decideErasure(admin.caller, id, { decision: 'approve' }))).toBe(409);
	});
});

describe('approving', () => {
	let her: ClientPerson;
	let neighbour: ClientPerson;
	let referralId: string;
	let documentId: string;
	let token: string;
	let subjectKey: string;
	let logRowsBefore: number;
	let planId: string;
	let requestId: string;

	beforeAll(async () => {
		({ her, referralId, documentId, token } = await fullClient('erased'));
		neighbour = await makeClient(studio, 'neighbour');
		({ id: planId } = await createPlan(instructor.caller, {
			title: 'Tuesday mat class',
			clientIds: [her.clientId, neighbour.clientId],
			exerciseIds: ['heel-slides']
		}));
		await db()
			.update(plans)
			.set({
				readyCheck: {
					checkedAt: new Date().toISOString(),
					cells: [her.clientId, neighbour.clientId].map((clientId) => ({
						clientId,
						itemIndex: 0,
						exerciseId: 'heel-slides',
						status: 'ok' as const
					}))
				}
			})
			.where(eq(plans.id, planId));
		await getClient(instructor.caller, her.clientId);
		({ id: requestId } = await requestErasure(her.caller));
		const preview = await getErasureRequest(admin.caller, requestId);
		expect(preview.preview?.erased.find((e) => e.what === 'Screenings')?.count).toBe(2);
		expect(preview.preview?.keptByClinics).toEqual([
			{ clinic: clinic.name, referrals: 1, documents: 1 }
		]);
		const [key] = await db()
			.select()
			.from(subjectKeys)
			.where(eq(subjectKeys.clientId, her.clientId));
		subjectKey = key!.key;
		logRowsBefore = (
			await db().select().from(accessLog).where(eq(accessLog.subjectKey, subjectKey))
		).length;
		const answer = await decideErasure(admin.caller, requestId, { decision: 'approve' });
		expect(answer).toMatchObject({ state: 'approved', client: null });
		expect(answer.erased).toMatchObject({ screenings: 2, referralsKeptByClinic: 1 });
	});

	it('has a rule for every table in the database, and the schema’s tables are exactly those', async () => {
		const result = await db().execute<{ table_name: string }>(
			sql`select table_name from information_schema.tables
				where table_schema = 'public' and table_type = 'BASE TABLE'`
		);
		const inDatabase = result.rows.map((r) => r.table_name).sort();
		expect(inDatabase).toEqual(Object.keys(ERASURE_RULES).sort());
	});

	it('leaves no row at the studio naming her id, her sign-in or her address, in any table', async () => {
		const needles = [her.clientId, her.userId, her.email];
		for (const [table, rule] of Object.entries(ERASURE_RULES)) {
			if (rule.rule === 'log') continue;
			expect(await rowsNaming(table, needles), `${table} (${rule.rule})`).toBe(0);
		}
		const [client] = await db().select().from(clients).where(eq(clients.id, her.clientId));
		expect(client).toBeUndefined();
		// Her neighbour's place in the plan and its check stay.
		const [plan] = await db().select().from(plans).where(eq(plans.id, planId));
		expect(plan!.readyCheck!.cells.map((c) => c.clientId)).toEqual([neighbour.clientId]);
	});

	it('keeps every log row, under a key that maps to nothing, and the chain verifies', async () => {
		const rows = await db().select().from(accessLog).where(eq(accessLog.subjectKey, subjectKey));
		expect(rows.length).toBe(logRowsBefore + 1); // the erasure itself, recorded under her key
		expect(rows.some((r) => r.action === 'client.erased')).toBe(true);
		const keys = await db().select().from(subjectKeys).where(eq(subjectKeys.key, subjectKey));
		expect(keys).toHaveLength(0);
		await sealPending(db(), { gapGraceMs: 0 });
		const report = await verifyChain(db());
		expect(report.intact).toBe(true);
		expect(report.firstBroken).toBeNull();
	});

	it('keeps the clinic’s referral, document and clearance; the studio no longer sees them', async () => {
		const kept = await getReferral(physio.caller, referralId);
		expect(kept).toMatchObject({ clientId: null, clientName: her.name });
		expect(kept.studioErasedAt).not.toBeNull();
		const [row] = await db().select().from(referrals).where(eq(referrals.id, referralId));
		expect(row!.clientId).toBeNull();
		const download = await downloadDocument(physio.caller, documentId);
		expect(download.bytes.length).toBeGreaterThan(0);

		expect(await statusOf(getReferral(instructor.caller, referralId))).toBe(404);
		expect(await statusOf(downloadDocument(instructor.caller, documentId))).toBe(404);
		const studioList = await listReferrals(instructor.caller, {
			state: [],
			sort: 'date',
			limit: 100
		});
		expect(studioList.items.map((i) => i.id)).not.toContain(referralId);
		const clinicList = await listReferrals(physio.caller, { state: [], sort: 'date', limit: 100 });
		expect(clinicList.items.map((i) => i.id)).toContain(referralId);
		expect(await objectExists(`referral-letters/${referralId}.pdf`)).toBe(true);
	});

	it('signs her out everywhere, and tells her and the clinic by mail (without her name)', async () => {
		const state = await resolveSession(token, {
			extend: false,
			access: { userId: null, role: null, organisationId: null, address: null, userAgent: null }
		});
		expect(state.state).toBe('none');
		const toClinic = await db().select().from(outbox).where(eq(outbox.to, physio.email));
		const informed = toClinic.filter((m) => m.kind === 'erasure.clinic_informed');
		expect(informed).toHaveLength(1);
		expect(informed[0]!.text).not.toContain(her.name);
		const confirmations = await db()
			.select()
			.from(outbox)
			.where(
				sql`${outbox.kind} = 'erasure.approved' and (${outbox.to} = ${her.email} or ${outbox.to} = 'erased@invalid')`
			);
		expect(confirmations.length).toBeGreaterThanOrEqual(1);
	});

	it('answers a second decision with 409', async () => {
		expect(await statusOf(decideErasure(admin.caller, requestId, { decision: 'approve' }))).toBe(
			409
		);
	});
});
