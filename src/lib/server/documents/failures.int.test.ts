import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
	embeddedFilePdf,
	encryptedPdf,
	javaScriptPdf,
	launchActionPdf,
	paddedPdf,
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
import { accessLog, documents, referrals } from '../db/schema';
import { letterKey } from '../referrals/letter';
import { openReferral, transitionReferral } from '../referrals/service';
import {
	addConsent,
	addScreening,
	logRows,
	makeClient,
	problemOf,
	statusOf,
	type Org,
	type Person
} from '../../../../tests/support/referral-fixtures';
import { getObject, listObjects, objectExists, putObject, useS3Endpoint } from '../storage';
import { documentKey, downloadLetter } from './service';
import { sweepOrphans } from './sweeper';
import {
	acceptedReferral as fixtureReferral,
	documentCast,
	MB,
	sha256,
	stored,
	upload,
	type DocumentCast,
	type ReferralSetup
} from '../../../../tests/support/document-fixtures';

// Assessment documents that must not get in, or must not get lost: hostile files refused with
// nothing stored, storage outages leaving no orphan, and the referral letter that is never
// made again — against the real PostgreSQL and the real s3rver. The limits (20 MB, 200 pages)
// are the product's documented limits — common practice, no source.

let studio: Org;
let clinic: Org;
let instructor: Person;
let physio: Person;
let cast: DocumentCast;

beforeAll(async () => {
	cast = await documentCast();
	({ studio, clinic, instructor, physio } = cast);
});

const acceptedReferral = (state?: 'accepted' | 'sent') => fixtureReferral(cast, state);

describe('hostile files', () => {
	let setup: ReferralSetup;
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
