import { and, eq, gt } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { activeEverywherePdf, pdfText, validPdf } from '../../../../tests/fixtures/pdf';
import { db } from '../db';
import { consents, documents, outbox } from '../db/schema';
import {
	logRows,
	problemOf,
	statusOf,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { getObject, putObject } from '../storage';
import {
	documentKey,
	downloadDocument,
	downloadLetter,
	getDocumentPanel,
	listDocuments,
	updateDocument
} from './service';
import { findActiveContent } from './pdf-check';
import { readPdf } from './qpdf';
import {
	acceptedReferral as fixtureReferral,
	documentCast,
	sha256,
	stored,
	upload,
	type DocumentCast,
	type ReferralSetup
} from '../../../../tests/support/document-fixtures';

// Assessment documents against the real PostgreSQL and the real s3rver: uploading, who sees
// what, and stamped downloads that never alter the original (hostile files, storage outages
// and the letter are in failures.int.test.ts). The rules checked are Seamwell's own
// (DESIGN.md, "Consent to share" and "Assessment").

let studio: Org;
let instructor: Person;
let physio: Person;
let otherPhysio: Person;
let otherStudioInstructor: Person;
let cast: DocumentCast;

beforeAll(async () => {
	cast = await documentCast();
	({ studio, instructor, physio, otherPhysio, otherStudioInstructor } = cast);
});

const acceptedReferral = (state?: 'accepted' | 'sent') => fixtureReferral(cast, state);

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
	let setup: ReferralSetup;
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
		// The page lists the newest upload first (the clinic notes came second).
		const clinicPanel = await getDocumentPanel(physio.caller, setup.referralId);
		expect(clinicPanel.items.map((i) => i.id)).toEqual([clinicOnly, shared]);
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
