import { createHash } from 'node:crypto';
import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import {
	activeEverywherePdf,
	danglingTransformPdf,
	embeddedFilePdf,
	javaScriptPdf,
	launchActionPdf,
	navigationOnlyPdf,
	pdfText,
	pdfWordBoxes,
	predictedObjectStreamJavaScriptPdf,
	richMediaPdf,
	submitFormOnPageOpenPdf,
	uncGoToRPdf,
	uriOnOpenPdf,
	validPdf,
	xfaPdf
} from '../../../../tests/fixtures/pdf';
import { findActiveContent, inspectPdf } from './pdf-check';
import { readPdf, type QpdfJson } from './qpdf';
import { formatStampTime, stampPdf, stampText } from './stamp';

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');
/** pdftotext breaks lines and pages with its own whitespace; compare words. */
const words = (text: string) => text.replace(/\s+/g, ' ').trim();

const viewer = {
	viewerName: 'Tess Almeida',
	organisation: 'Linden Row Studio',
	at: new Date('2026-12-02T14:05:09Z')
};
const EXPECTED =
	'Downloaded by Tess Almeida (Linden Row Studio) on 2 Dec 2026, 14:05 UTC — Seamwell';

describe('stampText', () => {
	it('names the viewer, organisation and UTC time', () => {
		expect(stampText(viewer)).toBe(EXPECTED);
		expect(stampText({ viewerName: 'Ana Ruiz', at: new Date('2027-01-09T08:00:00Z') })).toBe(
			'Downloaded by Ana Ruiz on 9 Jan 2027, 08:00 UTC — Seamwell'
		);
	});

	it('formats in UTC whatever the instant’s offset was', () => {
		expect(formatStampTime(new Date('2026-12-31T23:30:00-02:00'))).toBe('1 Jan 2027, 01:30 UTC');
		expect(() => formatStampTime(new Date('nope'))).toThrow(RangeError);
	});
});

describe('stampPdf', { timeout: 30_000 }, () => {
	it('puts the stamp on every page of a 3-page PDF and leaves the original bytes alone', async () => {
		const original = await validPdf({ pages: 3 });
		const before = sha256(original);
		const stamped = await stampPdf(original, viewer);

		expect(sha256(original)).toBe(before);
		expect(sha256(stamped)).not.toBe(before);
		const doc = await PDFDocument.load(stamped);
		expect(doc.getPageCount()).toBe(3);
		for (const page of [1, 2, 3]) {
			const text = words(pdfText(stamped, page));
			expect(text).toContain(EXPECTED);
			// The page's own content is still there.
			expect(text).toContain(`Assessment notes, page ${page}.`);
		}
		// A stamped file still passes the upload checks (no scripts, complete, readable).
		expect(await inspectPdf(stamped)).toMatchObject({ ok: true, pages: 3 });
	});

	it('stamps rotated, landscape and tiny pages legibly (text reads upright and whole)', async () => {
		const original = await validPdf({
			pages: 4,
			size: [400, 250],
			rotations: [0, 90, 180, 270]
		});
		const stamped = await stampPdf(original, viewer);
		for (const page of [1, 2, 3, 4]) {
			// pdftotext drops text it finds outside the visible box or unreadable as a line.
			expect(words(pdfText(stamped, page))).toContain(EXPECTED);
		}
		const tiny = await stampPdf(await validPdf({ size: [120, 120], text: false }), viewer);
		expect(words(pdfText(tiny, 1)).replace(/ /g, '')).toContain(EXPECTED.replace(/ /g, ''));
	});

	it('puts the line at the foot of each page as shown, inside the page, whatever the rotation', async () => {
		const stamped = await stampPdf(
			await validPdf({ pages: 4, size: [400, 250], rotations: [0, 90, 180, 270] }),
			viewer
		);
		const stampWords = pdfWordBoxes(stamped).filter((box) => box.word === 'Downloaded');
		expect(stampWords.map((box) => box.page)).toEqual([1, 2, 3, 4]);
		for (const box of stampWords) {
			// poppler gives word boxes as shown but the page size unrotated: pages 2 and 4 turn.
			const shownHeight = box.page % 2 === 0 ? box.pageWidth : box.pageHeight;
			// Upright and horizontal (wider than tall), in the bottom 30 pt, left margin inside.
			expect(box.xMax - box.xMin).toBeGreaterThan(box.yMax - box.yMin);
			expect(box.yMax).toBeLessThanOrEqual(shownHeight);
			expect(box.yMin).toBeGreaterThan(shownHeight - 30);
			expect(box.xMin).toBeGreaterThan(0);
			expect(box.xMin).toBeLessThan(30);
		}
	});

	it('is not thrown off by page content that leaves a transform in place', async () => {
		const stamped = await stampPdf(danglingTransformPdf(), viewer);
		const [box] = pdfWordBoxes(stamped).filter((word) => word.word === 'Downloaded');
		expect(box).toBeDefined();
		expect(box?.yMin).toBeGreaterThan(200 - 30);
		expect(box?.yMax).toBeLessThanOrEqual(200);
		expect(box?.xMax).toBeLessThan(100);
	});

	it('handles names outside the latin font without crashing', async () => {
		const stamped = await stampPdf(await validPdf(), {
			viewerName: 'Łucja Wąsowska 🌿',
			organisation: 'Studio Ørsted',
			at: viewer.at
		});
		const text = words(pdfText(stamped, 1));
		expect(text).toContain('Downloaded by Lucja Wasowska ? (Studio Ørsted) on 2 Dec 2026');
	});
});

/** The stamped copy as qpdf reads it; fails the test when qpdf cannot read it cleanly. */
async function parsed(bytes: Uint8Array): Promise<QpdfJson> {
	const read = await readPdf(bytes);
	if (read.kind !== 'read') throw new Error(`qpdf could not read the stamped copy: ${read.kind}`);
	return read.json;
}

describe('stampPdf disarms the copy it serves', { timeout: 30_000 }, () => {
	it('removes every action but /GoTo, scripts, attachments and XFA, keeping page and links within it', async () => {
		const original = await activeEverywherePdf();
		// The fixture really carries them all (the upload check would refuse it).
		const before = findActiveContent(await parsed(original));
		expect(before.active).toEqual(
			expect.arrayContaining(['/OpenAction', '/AA /WC', '/AA /O', '/A', '/JavaScript', '/XFA'])
		);
		expect(before.embedded).toEqual(expect.arrayContaining(['/EmbeddedFiles', '/EF']));

		const stamped = await stampPdf(original, viewer);
		const json = await parsed(stamped);
		expect(findActiveContent(json)).toEqual({ active: [], embedded: [] });
		const written = JSON.stringify(json.qpdf[1]);
		for (const gone of [
			'app.alert',
			'tracker.example',
			'collector.example',
			'calc.exe',
			'run.sh'
		]) {
			expect(written).not.toContain(gone);
		}
		expect(written).not.toContain('/OpenAction');
		expect(written).not.toContain('"/AA"');
		expect(written).not.toContain('/Next');
		// The in-document link is still there, and so is the page with its text and stamp.
		expect(written).toContain('"/S":"/GoTo"');
		expect(words(pdfText(stamped, 1))).toContain('Assessment notes');
		expect(words(pdfText(stamped, 1))).toContain(EXPECTED);
		expect(await inspectPdf(stamped)).toMatchObject({ ok: true, pages: 1 });
	});

	it('keeps what only navigates: a /GoTo link and a structure element’s attributes', async () => {
		const json = await parsed(await stampPdf(navigationOnlyPdf(), viewer));
		const written = JSON.stringify(json.qpdf[1]);
		expect(written).toContain('"/A":{"/D":');
		expect(written).toContain('"/S":"/GoTo"');
		expect(written).toContain('"/A":{"/O":"/Layout","/Placement":"/Block"}');
	});

	const hostile: Array<[string, () => Promise<Uint8Array> | Uint8Array]> = [
		['JavaScript in a predicted object stream', predictedObjectStreamJavaScriptPdf],
		['JavaScript on open', () => javaScriptPdf(true)],
		['a web address on open', uriOnOpenPdf],
		['a form submitted on page open', submitFormOnPageOpenPdf],
		['a link to a UNC path', uncGoToRPdf],
		['a launch action', launchActionPdf],
		['an XFA form', xfaPdf],
		['a RichMedia annotation', richMediaPdf],
		['an attached file', embeddedFilePdf]
	];
	for (const [label, make] of hostile) {
		it(`serves ${label} without it`, async () => {
			const original = await make();
			const before = findActiveContent(await parsed(original));
			expect([...before.active, ...before.embedded].length).toBeGreaterThan(0);
			const stamped = await stampPdf(original, viewer);
			expect(findActiveContent(await parsed(stamped))).toEqual({ active: [], embedded: [] });
			expect(words(pdfText(stamped, 1))).toContain(EXPECTED);
		});
	}
});
