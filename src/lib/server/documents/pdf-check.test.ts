import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
	embeddedFilePdf,
	fakeStreamJavaScriptPdf,
	encryptedPdf,
	hexEscapedJavaScriptPdf,
	htmlThenPdf,
	javaScriptPdf,
	launchActionPdf,
	lowerHexEscapedJavaScriptPdf,
	objectStreamPdf,
	paddedPdf,
	pdfWithNoPages,
	pngBytes,
	polyglotPdf,
	rawPdf,
	textBytes,
	truncatedPdf,
	validPdf,
	zipBombPdf
} from '../../../../tests/fixtures/pdf';
import { decodePdfName, inspectPdf, scanPdfNames, type PdfInspection } from './pdf-check';

const MB = 1024 * 1024;
const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('latin1');

function codeOf(result: PdfInspection): string {
	return result.ok ? 'ok' : result.code;
}

describe('inspectPdf accepts', () => {
	it('a valid one-page PDF, with its page count and SHA-256', async () => {
		const bytes = await validPdf();
		const result = await inspectPdf(bytes);
		expect(result).toEqual({
			ok: true,
			pages: 1,
			sha256: createHash('sha256').update(bytes).digest('hex')
		});
	});

	it('a PDF without object streams, and one ending in CRLF after %%EOF', async () => {
		const plain = await validPdf({ pages: 3, useObjectStreams: false });
		expect(await inspectPdf(plain)).toMatchObject({ ok: true, pages: 3 });
		const withoutEol = plain.slice(0, text(plain).lastIndexOf('%%EOF') + 5);
		const crlf = Buffer.concat([withoutEol, Buffer.from('\r\n')]);
		expect(await inspectPdf(withoutEol)).toMatchObject({ ok: true });
		expect(await inspectPdf(crlf)).toMatchObject({ ok: true });
	});

	it('a PDF that mentions a JavaScript-like word inside a longer name', async () => {
		// `/JSON` and `/Launcher` are not `/JS` or `/Launch`: names match whole.
		const bytes = rawPdf([
			'<< /Type /Catalog /Pages 2 0 R /JSON 1 /Launcher 2 >>',
			'<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
			'<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >>'
		]);
		expect(await inspectPdf(bytes)).toMatchObject({ ok: true, pages: 1 });
	});

	it('exactly 200 pages by default, and a smaller limit when given', async () => {
		const bytes = await validPdf({ pages: 200, size: [10, 10], text: false });
		expect(await inspectPdf(bytes)).toMatchObject({ ok: true, pages: 200 });
		expect(codeOf(await inspectPdf(bytes, { maxPages: 199 }))).toBe('too_many_pages');
	});
});

describe('inspectPdf refuses', () => {
	it('an empty file', async () => {
		expect(codeOf(await inspectPdf(new Uint8Array()))).toBe('empty');
	});

	it('a file just over 20 MB, and accepts the same PDF under a larger limit', async () => {
		const bytes = paddedPdf(20 * MB);
		expect(bytes.length).toBeGreaterThan(20 * MB);
		const result = await inspectPdf(bytes);
		expect(result).toMatchObject({ ok: false, code: 'too_large' });
		expect(result.ok ? '' : result.message).toContain('20 MB');
		// The padded fixture is otherwise a sound PDF.
		expect(await inspectPdf(bytes, { maxBytes: 21 * MB })).toMatchObject({ ok: true, pages: 1 });
	});

	it('PNG bytes or plain text renamed to .pdf', async () => {
		expect(codeOf(await inspectPdf(pngBytes()))).toBe('not_pdf');
		expect(codeOf(await inspectPdf(textBytes()))).toBe('not_pdf');
	});

	it('HTML placed before the PDF header', async () => {
		expect(codeOf(await inspectPdf(await htmlThenPdf()))).toBe('not_pdf');
	});

	it('a PDF cut in half (pdf-lib alone would open it)', async () => {
		const bytes = await truncatedPdf();
		expect(codeOf(await inspectPdf(bytes))).toBe('truncated');
	});

	it('HTML or a ZIP after %%EOF (a polyglot)', async () => {
		expect(codeOf(await inspectPdf(await polyglotPdf('html')))).toBe('trailing_data');
		expect(codeOf(await inspectPdf(await polyglotPdf('zip')))).toBe('trailing_data');
	});

	it('anything but CR and LF after %%EOF, even a space', async () => {
		const bytes = Buffer.concat([await validPdf(), Buffer.from(' \n')]);
		expect(codeOf(await inspectPdf(bytes))).toBe('trailing_data');
	});

	it('an encrypted PDF (an /Encrypt dictionary in the trailer)', async () => {
		const bytes = encryptedPdf();
		expect(text(bytes)).toContain('/Encrypt 4 0 R');
		const result = await inspectPdf(bytes);
		expect(codeOf(result)).toBe('encrypted');
		expect(result.ok ? '' : result.message).toMatch(/password/);
	});

	it('a JavaScript OpenAction written in plain', async () => {
		const bytes = await javaScriptPdf(false);
		expect(text(bytes)).toContain('/JavaScript');
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('a JavaScript OpenAction hidden inside a compressed object stream', async () => {
		const bytes = await javaScriptPdf(true);
		// The fixture really hides it: the names appear nowhere in the bytes as written.
		expect(text(bytes)).not.toContain('JavaScript');
		expect(text(bytes)).not.toContain('/JS');
		expect(text(bytes)).toContain('/ObjStm');
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('hex-escaped names: /Java#53cript and /J#53, in upper or lower case hex', async () => {
		const upper = hexEscapedJavaScriptPdf();
		expect(text(upper)).not.toContain('/JavaScript');
		expect(codeOf(await inspectPdf(upper))).toBe('active_content');
		expect(codeOf(await inspectPdf(lowerHexEscapedJavaScriptPdf()))).toBe('active_content');
	});

	it('a launch action', async () => {
		expect(codeOf(await inspectPdf(launchActionPdf()))).toBe('active_content');
	});

	it('an attached file', async () => {
		const result = await inspectPdf(await embeddedFilePdf());
		expect(codeOf(result)).toBe('embedded_file');
		expect(result.ok ? '' : result.message).toMatch(/attached/);
	});

	it('201 pages', async () => {
		const bytes = await validPdf({ pages: 201, size: [10, 10], text: false });
		const result = await inspectPdf(bytes);
		expect(codeOf(result)).toBe('too_many_pages');
		expect(result.ok ? '' : result.message).toContain('201 pages');
	});

	it('a PDF with no pages', async () => {
		expect(codeOf(await inspectPdf(await pdfWithNoPages()))).toBe('no_pages');
	});

	it('a header and %%EOF with nothing readable between', async () => {
		const bytes = Buffer.from('%PDF-1.7\nthis is not a document\n%%EOF\n');
		expect(codeOf(await inspectPdf(bytes))).toBe('unreadable');
	});

	it('a page tree that contains itself, without hanging', async () => {
		const bytes = rawPdf([
			'<< /Type /Catalog /Pages 2 0 R >>',
			'<< /Type /Pages /Kids [2 0 R] /Count 1 >>'
		]);
		expect(codeOf(await inspectPdf(bytes))).toBe('unreadable');
	});

	it('an object stream that inflates past the cap (a zip bomb), quickly', async () => {
		const bytes = await zipBombPdf(40 * MB);
		expect(bytes.length).toBeLessThan(200 * 1024);
		const started = performance.now();
		expect(codeOf(await inspectPdf(bytes))).toBe('unreadable');
		expect(performance.now() - started).toBeLessThan(2000);
	});
});

describe('scanPdfNames (the byte-level layer, without pdf-lib)', () => {
	const JS_ACTION = '<< /Type /Action /S /JavaScript /JS (app.alert\\(1\\)) >>';

	function names(scan: ReturnType<typeof scanPdfNames>): Set<string> {
		if (scan.kind !== 'names') throw new Error(`scan failed: ${scan.code}`);
		return scan.names;
	}

	it('finds names inside the compressed object streams pdf-lib writes', async () => {
		const found = names(scanPdfNames(await javaScriptPdf(true)));
		expect(found.has('JavaScript')).toBe(true);
		expect(found.has('JS')).toBe(true);
		// …and in a clean file, no such names.
		const clean = names(scanPdfNames(await validPdf()));
		expect(clean.has('Catalog')).toBe(true);
		expect(clean.has('JavaScript')).toBe(false);
	});

	it('finds an object stream whose dictionary nests another dictionary', async () => {
		const bytes = await objectStreamPdf(JS_ACTION, { dictExtra: '/DecodeParms << /Columns 1 >>' });
		expect(text(bytes)).not.toContain('/JavaScript');
		expect(names(scanPdfNames(bytes)).has('JavaScript')).toBe(true);
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('does not open object streams of an encrypted file', async () => {
		const scan = names(scanPdfNames(encryptedPdf()));
		expect(scan.has('Encrypt')).toBe(true);
	});

	it('can be fooled by a fake stream inside strings, which the parsed-object check then catches', async () => {
		const bytes = fakeStreamJavaScriptPdf();
		expect(names(scanPdfNames(bytes)).has('JavaScript')).toBe(false);
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('refuses an object stream packed with a filter it cannot undo', async () => {
		const bytes = await objectStreamPdf(JS_ACTION, { filter: 'hex' });
		expect(scanPdfNames(bytes)).toMatchObject({ kind: 'failed', code: 'unreadable' });
		expect(codeOf(await inspectPdf(bytes))).toBe('unreadable');
	});
});

describe('decodePdfName', () => {
	it('undoes #xx escapes in either case and leaves a lone # alone', () => {
		expect(decodePdfName('Java#53cript')).toBe('JavaScript');
		expect(decodePdfName('#4a#53')).toBe('JS');
		expect(decodePdfName('A#2')).toBe('A#2');
	});
});
