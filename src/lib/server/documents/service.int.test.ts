import { createHash, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq, gt } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	activeEverywherePdf,
	embeddedFilePdf,
	encryptedPdf,
	javaScriptPdf,
	launchActionPdf,
	paddedPdf,
	pdfText,
	pngBytes,
	polyglotPdf,
	predictedObjectStreamJavaScriptPdf,
	rawPdf,
	richMediaPdf,
	submitFormOnPageOpenPdf,
	truncatedPdf,
	uncGoToRPdf,
	uriOnOpenPdf,
	validPdf,
	xfaPdf
} from '../../../../tests/fixtures/pdf';
import { requireEnv, superuser } from '../../../../tests/support/services';
import { db } from '../db';
import { accessLog, consents, documents, outbox, referrals } from '../db/schema';
import { letterKey } from '../referrals/letter';
import { openReferral, transitionReferral } from '../referrals/service';
import {
	makeCast,
	addConsent,
	addReferral,
	addScreening,
	logRows,
	makeClient,
	makeMember,
	makeOrg,
	problemOf,
	statusOf,
	type ClientPerson,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { getObject, listObjects, objectExists, putObject, useS3Endpoint } from '../storage';
import {
	documentKey,
	downloadDocument,
	downloadLetter,
	getDocumentPanel,
	listDocuments,
	updateDocument,
	uploadDocument
} from './service';
import { findActiveContent } from './pdf-check';
import { readPdf } from './qpdf';
import { sweepOrphans } from './sweeper';

// Assessment documents against the real PostgreSQL and the real s3rver: hostile files refused
// with nothing stored, storage outages leaving no orphan, who sees what, stamped downloads
// that never alter the original, and the letter that is never made again. The rules checked
// are Seamwell's own (DESIGN.md, "Consent to share" and "Assessment"); the limits (20 MB,
// 200 pages) are the product's documented limits — common practice, no source.

const MB = 1024 * 1024;
const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

let studio: Org;
let clinic: Org;
let instructor: Person;
let physio: Person;
let otherPhysio: Person;
let otherStudioInstructor: Person;

beforeAll(async () => {
	({ studio, clinic, instructor, physio, otherPhysio } = await makeCast());
	otherStudioInstructor = await makeMember(await makeOrg('studio', 'other studio'), 'instructor');
});

interface Setup {
	client: ClientPerson;
	referralId: string;
	consentId: string;
}

/** A client who consents to everything, and her referral, accepted by the clinic. */
async function acceptedReferral(state: 'accepted' | 'sent' = 'accepted'): Promise<Setup> {
	const client = await makeClient(studio);
	const consentId = await addConsent(client, studio, clinic);
	const referralId = await addReferral({
		clientId: client.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		physioId: physio.userId,
		state
	});
	return { client, referralId, consentId };
}

const upload = (
	caller: Person,
	referralId: string,
	bytes: Uint8Array,
	options: { fileName?: string; share?: 'clinic' | 'studio'; summary?: string | null } = {}
) =>
	uploadDocument(caller.caller, referralId, {
		bytes,
		fileName: options.fileName ?? 'assessment.pdf',
		share: options.share ?? 'clinic',
		summary: options.summary ?? null
	});

/** What the referral left behind: its rows and its stored objects. */
async function stored(referralId: string) {
	const rows = await db().select().from(documents).where(eq(documents.referralId, referralId));
	const objects = await listObjects(`documents/${referralId}/`);
	return { rows: rows.length, objects: objects.length };
}

describe('hostile files', () => {
	let setup: Setup;
	beforeAll(async () => {
		setup = await acceptedReferral();
	});

	const hostile: Array<[string, () => Promise<Uint8Array> | Uint8Array, string]> = [
		['a picture renamed to .pdf', pngBytes, 'not_pdf'],
		['an empty file', () => new Uint8Array(0), 'empty'],
		['a truncated PDF', truncatedPdf, 'truncated'],
		['an encrypted PDF', encryptedPdf, 'encrypted'],
		['a PDF with JavaScript', () => javaScriptPdf(true), 'active_content'],
		[
			'JavaScript in a PNG-predicted object stream',
			predictedObjectStreamJavaScriptPdf,
			'active_content'
		],
		['a web address opened with the file', uriOnOpenPdf, 'active_content'],
		['a form submitted when the page opens', submitFormOnPageOpenPdf, 'active_content'],
		['a link to a UNC path', uncGoToRPdf, 'active_content'],
		['a launch action', launchActionPdf, 'active_content'],
		['an XFA form', xfaPdf, 'active_content'],
		['a RichMedia annotation', richMediaPdf, 'active_content'],
		[
			'a PDF the parser cannot read whole',
			() => Buffer.from('%PDF-1.7\n1 0 obj << /Type /Catalog /Pages 2 0 R >>\n%%EOF\n'),
			'unreadable'
		],
		['a PDF with an embedded file', embeddedFilePdf, 'embedded_file'],
		['a PDF + HTML polyglot', () => polyglotPdf('html'), 'trailing_data'],
		['a PDF + ZIP polyglot', () => polyglotPdf('zip'), 'trailing_data'],
		['a PDF just over 20 MB', () => paddedPdf(20 * MB), 'too_large'],
		[
			'a PDF of 201 pages',
			() => validPdf({ pages: 201, size: [20, 20], text: false }),
			'too_many_pages'
		]
	];

	for (const [label, make, code] of hostile) {
		it(`refuses ${label} with a clear message, storing nothing`, async () => {
			const problem = await problemOf(upload(physio, setup.referralId, await make()));
			expect(problem.status).toBe(422);
			expect(problem.code).toBe(code);
			expect(problem.errors?.[0]?.pointer).toBe('/file');
			expect(problem.detail).toMatch(/Nothing was saved\.$/);
			expect(problem.detail.length).toBeGreaterThan(40);
			expect(await stored(setup.referralId)).toEqual({ rows: 0, objects: 0 });
		});
	}

	it('says "we could not read every part of this PDF" for a file the parser cannot read', async () => {
		// Every object three bytes from where the cross-reference table says: readers guess.
		const sound = rawPdf([
			'<< /Type /Catalog /Pages 2 0 R >>',
			'<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
			'<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >>'
		]);
		const text = Buffer.from(sound).toString('latin1');
		const shifted = Buffer.from(text.replace('%PDF-1.7\n', '%PDF-1.7\n   '), 'latin1');
		const problem = await problemOf(upload(physio, setup.referralId, shifted));
		expect(problem.code).toBe('unreadable');
		expect(problem.detail).toMatch(/we could not read every part of this PDF/i);
		expect(problem.errors?.[0]?.message).toMatch(/we could not read every part of this PDF/i);
	});

	it('records each refused file in the access log, as a failed upload', async () => {
		const failed = (await logRows(physio.userId, 'document.uploaded')).filter(
			(r) => r.targetId === setup.referralId && r.outcome === 'failed'
		);
		expect(failed.length).toBe(hostile.length + 1);
	});
});

describe('uploading', () => {
	it('stores the file under a key the server chose, its SHA-256 intact, with a row and a log entry', async () => {
		const { referralId } = await acceptedReferral();
		const bytes = await validPdf({ pages: 3 });
		const { id } = await upload(physio, referralId, bytes, {
			fileName: '../../etc/Assessment 12 May.pdf'
		});
		const [row] = await db().select().from(documents).where(eq(documents.id, id));
		expect(row!.storageKey).toBe(documentKey(referralId, id));
		expect(row!.fileName).toBe('Assessment 12 May.pdf');
		expect(row!.pages).toBe(3);
		expect(row!.sizeBytes).toBe(bytes.length);
		expect(row!.share).toBe('clinic');
		const object = await getObject(row!.storageKey);
		expect(sha256(object)).toBe(sha256(bytes));
		expect(row!.sha256).toBe(sha256(bytes));
		const [logged] = await logRows(physio.userId, 'document.uploaded');
		expect(logged).toMatchObject({ outcome: 'success', targetType: 'document', targetId: id });
	});

	it('is refused to the studio (403), before acceptance (409), without consent (409), elsewhere (404)', async () => {
		const { referralId } = await acceptedReferral();
		const bytes = await validPdf();
		expect(await statusOf(upload(instructor, referralId, bytes))).toBe(403);
		expect(await statusOf(upload(otherPhysio, referralId, bytes))).toBe(404);
		expect(await statusOf(upload(otherStudioInstructor, referralId, bytes))).toBe(404);
		const sent = await acceptedReferral('sent');
		expect(await statusOf(upload(physio, sent.referralId, bytes))).toBe(409);
		const lapsed = await acceptedReferral();
		await db()
			.update(consents)
			.set({ withdrawnAt: new Date() })
			.where(eq(consents.id, lapsed.consentId));
		const problem = await problemOf(upload(physio, lapsed.referralId, bytes));
		expect(problem.type).toBe('/problems/consent-required');
		for (const id of [referralId, sent.referralId, lapsed.referralId]) {
			expect(await stored(id)).toEqual({ rows: 0, objects: 0 });
		}
		const refused = await logRows(otherPhysio.userId, 'document.uploaded');
		expect(refused[0]).toMatchObject({ outcome: 'refused', targetId: referralId });
	});

	it('queues a mail without health details to the instructor for a shareable document only', async () => {
		const { referralId } = await acceptedReferral();
		const since = new Date(Date.now() - 1000);
		await upload(physio, referralId, await validPdf(), {
			fileName: 'Private findings.pdf',
			summary: 'Hold impact work.'
		});
		const mailsFor = () =>
			db()
				.select()
				.from(outbox)
				.where(
					and(
						eq(outbox.to, instructor.email.toLowerCase()),
						eq(outbox.kind, 'document.shared'),
						gt(outbox.createdAt, since)
					)
				);
		expect(await mailsFor()).toHaveLength(0);
		await upload(physio, referralId, await validPdf(), {
			fileName: 'Private findings for the studio.pdf',
			share: 'studio',
			summary: 'Hold impact work until the review.'
		});
		const mails = await mailsFor();
		expect(mails).toHaveLength(1);
		// Queued in the upload's own commit: delivery is the outbox worker's, later, so a mail
		// server that is down never stops an upload (src/lib/server/mail/outbox.int.test.ts).
		expect(mails[0]!.state).toBe('pending');
		expect(mails[0]!.text).toContain(`/referrals/${referralId}`);
		for (const secret of ['Private', 'impact', 'findings']) {
			expect(mails[0]!.text).not.toContain(secret);
			expect(mails[0]!.subject).not.toContain(secret);
		}
	});
});

describe('sharing with the studio', () => {
	let setup: Setup;
	let shared: string;
	let clinicOnly: string;
	beforeAll(async () => {
		setup = await acceptedReferral();
		shared = (
			await upload(physio, setup.referralId, await validPdf({ pages: 2 }), {
				fileName: 'For the studio.pdf',
				share: 'studio',
				summary: 'Low-load work only until the review.'
			})
		).id;
		clinicOnly = (
			await upload(physio, setup.referralId, await validPdf(), { fileName: 'Clinic notes.pdf' })
		).id;
	});

	it('the clinic lists both; the studio only the shareable one, with its summary', async () => {
		const forClinic = await listDocuments(physio.caller, setup.referralId, { limit: 25 });
		expect(forClinic.items.map((i) => i.id).sort()).toEqual([shared, clinicOnly].sort());
		const forStudio = await listDocuments(instructor.caller, setup.referralId, { limit: 25 });
		expect(forStudio.items.map((i) => i.id)).toEqual([shared]);
		expect(forStudio.items[0]).toMatchObject({
			name: 'For the studio.pdf',
			share: 'studio',
			pages: 2,
			summary: 'Low-load work only until the review.',
			uploadedBy: physio.name
		});
		const panel = await getDocumentPanel(instructor.caller, setup.referralId);
		expect(panel.items.map((i) => i.id)).toEqual([shared]);
		expect(panel.canUpload).toBe(false);
	});

	it('pages the list with a cursor', async () => {
		const first = await listDocuments(physio.caller, setup.referralId, { limit: 1 });
		expect(first.items).toHaveLength(1);
		expect(first.nextCursor).not.toBeNull();
		const second = await listDocuments(physio.caller, setup.referralId, {
			limit: 1,
			cursor: first.nextCursor!
		});
		expect(second.items).toHaveLength(1);
		expect(second.items[0]!.id).not.toBe(first.items[0]!.id);
		expect(second.nextCursor).toBeNull();
	});

	it('a clinic-only document is not there for the studio (404), nor can it change one', async () => {
		expect(await statusOf(downloadDocument(instructor.caller, clinicOnly))).toBe(404);
		expect(await statusOf(updateDocument(instructor.caller, clinicOnly, { share: 'studio' }))).toBe(
			404
		);
		// A shareable one she may see, but changing it is the clinic's: 403.
		expect(await statusOf(updateDocument(instructor.caller, shared, { summary: 'x' }))).toBe(403);
	});

	it('another clinic gets 404 on every document URL and on the letter', async () => {
		for (const id of [shared, clinicOnly]) {
			expect(await statusOf(downloadDocument(otherPhysio.caller, id))).toBe(404);
			expect(await statusOf(updateDocument(otherPhysio.caller, id, { share: 'clinic' }))).toBe(404);
		}
		expect(await statusOf(listDocuments(otherPhysio.caller, setup.referralId, { limit: 5 }))).toBe(
			404
		);
		expect(await statusOf(downloadLetter(otherPhysio.caller, setup.referralId))).toBe(404);
		expect(await statusOf(getDocumentPanel(otherPhysio.caller, setup.referralId))).toBe(404);
		const refusals = await logRows(otherPhysio.userId, 'document.downloaded');
		expect(refusals.filter((r) => r.outcome === 'refused').length).toBeGreaterThanOrEqual(2);
	});

	it('the physio marks a document shareable: the studio sees it and the instructor is told', async () => {
		const sharedMails = () =>
			db()
				.select()
				.from(outbox)
				.where(
					and(eq(outbox.kind, 'document.shared'), eq(outbox.to, instructor.email.toLowerCase()))
				);
		const before = (await sharedMails()).length;
		const updated = await updateDocument(physio.caller, clinicOnly, {
			share: 'studio',
			summary: 'Gentle return to class.'
		});
		expect(updated).toMatchObject({ share: 'studio', summary: 'Gentle return to class.' });
		const forStudio = await listDocuments(instructor.caller, setup.referralId, { limit: 25 });
		expect(forStudio.items.map((i) => i.id).sort()).toEqual([shared, clinicOnly].sort());
		expect(await sharedMails()).toHaveLength(before + 1);
		const [logged] = await logRows(physio.userId, 'document.updated');
		expect(logged).toMatchObject({ outcome: 'success', targetId: clinicOnly });
		await updateDocument(physio.caller, clinicOnly, { share: 'clinic' });
		expect(await statusOf(downloadDocument(instructor.caller, clinicOnly))).toBe(404);
	});

	it('downloads are stamped with who and when; the stored original never changes', async () => {
		const [row] = await db().select().from(documents).where(eq(documents.id, shared));
		const before = await getObject(row!.storageKey);
		const first = await downloadDocument(instructor.caller, shared);
		const second = await downloadDocument(physio.caller, shared);
		expect(first.fileName).toBe('For the studio.pdf');
		for (const page of [1, 2]) {
			expect(pdfText(first.bytes, page)).toContain(`Downloaded by ${instructor.name}`);
			expect(pdfText(first.bytes, page)).toContain(studio.name);
			expect(pdfText(second.bytes, page)).toContain(`Downloaded by ${physio.name}`);
		}
		const after = await getObject(row!.storageKey);
		expect(sha256(after)).toBe(sha256(before));
		expect(sha256(after)).toBe(row!.sha256);
		expect(sha256(first.bytes)).not.toBe(row!.sha256);
		const logged = await logRows(instructor.userId, 'document.downloaded');
		expect(logged[0]).toMatchObject({ outcome: 'success', targetId: shared });
	});

	it('a stored file with actions (one an earlier check let through) downloads disarmed', async () => {
		const { id } = await upload(physio, setup.referralId, await validPdf(), {
			fileName: 'Accepted long ago.pdf'
		});
		const [row] = await db().select().from(documents).where(eq(documents.id, id));
		const hostile = Buffer.from(await activeEverywherePdf());
		await putObject(row!.storageKey, hostile, 'application/pdf');
		await db()
			.update(documents)
			.set({ sha256: sha256(hostile) })
			.where(eq(documents.id, id));

		const { bytes } = await downloadDocument(physio.caller, id);
		const read = await readPdf(bytes);
		if (read.kind !== 'read') throw new Error(`the download is not a readable PDF: ${read.kind}`);
		expect(findActiveContent(read.json)).toEqual({ active: [], embedded: [] });
		expect(pdfText(bytes, 1)).toContain(`Downloaded by ${physio.name}`);
		// The stored file is left as it was.
		expect(sha256(await getObject(row!.storageKey))).toBe(sha256(hostile));
	});

	it('after consent with documents ends, the studio gets nothing more; the clinic keeps its own', async () => {
		await db()
			.update(consents)
			.set({ withdrawnAt: new Date() })
			.where(eq(consents.id, setup.consentId));
		const problem = await problemOf(downloadDocument(instructor.caller, shared));
		expect(problem.status).toBe(403);
		expect(problem.detail).toContain('sharing ended on');
		expect(await statusOf(listDocuments(instructor.caller, setup.referralId, { limit: 5 }))).toBe(
			403
		);
		const panel = await getDocumentPanel(instructor.caller, setup.referralId);
		expect(panel.items).toEqual([]);
		expect(panel.studioSharing.endedAt).not.toBeNull();
		expect((await downloadDocument(physio.caller, shared)).bytes.length).toBeGreaterThan(0);
		expect(await statusOf(upload(physio, setup.referralId, await validPdf()))).toBe(409);
	});
});

describe('storage failures leave no orphan', () => {
	// An s3rver of the test's own, on a port of its own, so it can be stopped and started.
	interface Fake {
		port: number;
		close(): Promise<void>;
	}
	const fakeModule = `${process.cwd()}/fakes/s3.mjs`;
	let directory: string;
	let fake: Fake | undefined;
	let startS3Fake: (options: { port: number; directory: string; bucket: string }) => Promise<Fake>;

	beforeAll(async () => {
		({ startS3Fake } = (await import(/* @vite-ignore */ fakeModule)) as {
			startS3Fake: typeof startS3Fake;
		});
		directory = mkdtempSync(join(tmpdir(), 'seamwell-docs-s3-'));
	});
	afterAll(async () => {
		useS3Endpoint(null);
		await fake?.close();
		rmSync(directory, { recursive: true, force: true });
	});

	it('S3 stopped: "storage unavailable, nothing was saved"; the same upload succeeds once it is back', async () => {
		const bucket = requireEnv('S3_BUCKET');
		fake = await startS3Fake({ port: 0, directory, bucket });
		const port = fake.port;
		useS3Endpoint(`http://127.0.0.1:${port}`);
		const { referralId } = await acceptedReferral();
		const bytes = await validPdf({ pages: 2 });
		await fake.close();
		fake = undefined;

		const problem = await problemOf(upload(physio, referralId, bytes));
		expect(problem.status).toBe(503);
		expect(problem.type).toBe('/problems/storage-unavailable');
		expect(problem.detail).toMatch(/unavailable, so nothing was saved/);
		const rows = await db().select().from(documents).where(eq(documents.referralId, referralId));
		expect(rows).toHaveLength(0);

		fake = await startS3Fake({ port, directory, bucket });
		const { id } = await upload(physio, referralId, bytes);
		expect(await listObjects(`documents/${referralId}/`)).toEqual([
			expect.objectContaining({ key: documentKey(referralId, id) })
		]);
		expect(sha256(await getObject(documentKey(referralId, id)))).toBe(sha256(bytes));
		useS3Endpoint(null);
	});

	it('a row that cannot be written takes its object with it', async () => {
		const { referralId } = await acceptedReferral();
		const admin = await superuser(requireEnv('DB_NAME'));
		try {
			await admin.query(`
				create or replace function documents_test_refuse() returns trigger language plpgsql as $$
				begin
					if new.file_name = 'row-fails.pdf' then raise exception 'refused by the test'; end if;
					return new;
				end $$;
				create trigger documents_test_refuse before insert on documents
					for each row execute function documents_test_refuse();`);
			await expect(
				upload(physio, referralId, await validPdf(), { fileName: 'row-fails.pdf' })
			).rejects.toThrow();
			expect(await stored(referralId)).toEqual({ rows: 0, objects: 0 });
		} finally {
			await admin.query(`
				drop trigger if exists documents_test_refuse on documents;
				drop function if exists documents_test_refuse();`);
			await admin.end();
		}
	});

	it('the sweeper removes an object without a row once it is old enough, and nothing else', async () => {
		const { referralId } = await acceptedReferral();
		const kept = await upload(physio, referralId, await validPdf());
		const orphan = documentKey(referralId, randomUUID());
		await putObject(orphan, Buffer.from(await validPdf()), 'application/pdf');

		// Young: an upload may be between its object and its row.
		expect(await sweepOrphans(db())).not.toContain(orphan);
		expect(await objectExists(orphan)).toBe(true);

		const later = new Date(Date.now() + 2 * 60 * 60 * 1000);
		const deleted = await sweepOrphans(db(), { now: later });
		expect(deleted).toContain(orphan);
		expect(await objectExists(orphan)).toBe(false);
		expect(await objectExists(documentKey(referralId, kept.id))).toBe(true);
	});
});

describe('the referral letter', () => {
	it('is made when the referral is sent, downloaded by both sides as stored, and never made again', async () => {
		const client = await makeClient(studio);
		await addScreening(client.clientId, new Date('2025-03-01T10:00:00Z'), [2, 3, 2]);
		await addConsent(client, studio, clinic);
		const { id } = await openReferral(instructor.caller, {
			clientId: client.clientId,
			clinicId: clinic.id,
			physioId: physio.userId,
			reason: 'Three finger widths at the navel (invented).',
			urgency: 'routine',
			redFlags: []
		});
		expect(await statusOf(downloadLetter(instructor.caller, id))).toBe(404);
		expect(await statusOf(downloadLetter(physio.caller, id))).toBe(404);

		await transitionReferral(instructor.caller, id, { to: 'sent', reason: null });
		const stored = await getObject(letterKey(id));
		const [written] = await listObjects(letterKey(id));
		const forStudio = await downloadLetter(instructor.caller, id);
		const forClinic = await downloadLetter(physio.caller, id);
		expect(sha256(forStudio.bytes)).toBe(sha256(stored));
		expect(sha256(forClinic.bytes)).toBe(sha256(stored));
		expect(forStudio.fileName).toMatch(/^referral-letter-\d{4}-\d{2}-\d{2}\.pdf$/);

		await transitionReferral(physio.caller, id, { to: 'accepted', reason: null });
		await transitionReferral(physio.caller, id, { to: 'assessed', reason: 'Seen (invented).' });
		const [later] = await listObjects(letterKey(id));
		expect(sha256(await getObject(letterKey(id)))).toBe(sha256(stored));
		expect(later!.lastModified?.getTime()).toBe(written!.lastModified?.getTime());

		const logged = await db()
			.select()
			.from(accessLog)
			.where(and(eq(accessLog.action, 'letter.downloaded'), eq(accessLog.targetId, id)));
		expect(logged.filter((r) => r.outcome === 'success')).toHaveLength(2);
		expect(logged.filter((r) => r.outcome === 'refused')).toHaveLength(2);
		const [row] = await db().select().from(referrals).where(eq(referrals.id, id));
		expect(row!.state).toBe('assessed');
	});
});
