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
	navigationOnlyPdf,
	pngBytes,
	polyglotPdf,
	predictedObjectStreamJavaScriptPdf,
	richMediaPdf,
	submitFormOnPageOpenPdf,
	uncGoToRPdf,
	uriOnOpenPdf,
	xfaPdf,
	rawPdf,
	textBytes,
	truncatedPdf,
	validPdf,
	zipBombPdf
} from '../../../../tests/fixtures/pdf';
import { inspectPdf, type PdfInspection } from './pdf-check';

const MB = 1024 * 1024;
const text = (bytes: Uint8Array) => Buffer.from(bytes).toString('latin1');

function codeOf(result: PdfInspection): string {
	return result.ok ? 'ok' : result.code;
}

describe('inspectPdf accepts', { timeout: 30_000 }, () => {
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

	it('in-document navigation: an open destination, a /GoTo link, tags, labels, border styles', async () => {
		expect(await inspectPdf(navigationOnlyPdf())).toMatchObject({ ok: true, pages: 1 });
	});

	it('exactly 200 pages by default, and a smaller limit when given', async () => {
		const bytes = await validPdf({ pages: 200, size: [10, 10], text: false });
		expect(await inspectPdf(bytes)).toMatchObject({ ok: true, pages: 200 });
		expect(codeOf(await inspectPdf(bytes, { maxPages: 199 }))).toBe('too_many_pages');
	});
});

describe('inspectPdf refuses', { timeout: 30_000 }, () => {
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

	it('JavaScript in an object stream whose Flate data is PNG-predicted (/Predictor 12)', async () => {
		const bytes = await predictedObjectStreamJavaScriptPdf();
		expect(text(bytes)).toContain('/Predictor 12');
		expect(text(bytes)).not.toContain('JavaScript');
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('a web address opened with the file (/OpenAction /URI)', async () => {
		expect(codeOf(await inspectPdf(uriOnOpenPdf()))).toBe('active_content');
	});

	it('a form submitted when the page opens (/AA /O /SubmitForm)', async () => {
		expect(codeOf(await inspectPdf(submitFormOnPageOpenPdf()))).toBe('active_content');
	});

	it('a link to a PDF on a UNC path (/GoToR to \\\\server\\share)', async () => {
		const bytes = uncGoToRPdf();
		expect(text(bytes)).toContain('(\\\\\\\\fileserver.example');
		expect(codeOf(await inspectPdf(bytes))).toBe('active_content');
	});

	it('an XFA form, and a RichMedia annotation', async () => {
		expect(codeOf(await inspectPdf(xfaPdf()))).toBe('active_content');
		expect(codeOf(await inspectPdf(richMediaPdf()))).toBe('active_content');
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

	it('an object stream that inflates past the parser’s memory (a zip bomb), in good time', async () => {
		const bytes = await zipBombPdf(40 * MB);
		expect(bytes.length).toBeLessThan(200 * 1024);
		const started = performance.now();
		const parser = { maxMemory: 48 * MB, timeoutMs: 30_000 };
		expect(codeOf(await inspectPdf(bytes, { parser }))).toBe('unreadable');
		expect(performance.now() - started).toBeLessThan(15_000);
	});

	it('a file the parser cannot finish within its time', async () => {
		const parser = { maxMemory: 512 * MB, timeoutMs: 1 };
		expect(codeOf(await inspectPdf(await validPdf(), { parser }))).toBe('unreadable');
	});
});

describe('inspectPdf reads the file as a reader does', { timeout: 30_000 }, () => {
	const JS_ACTION = '<< /Type /Action /S /JavaScript /JS (app.alert\\(1\\)) >>';

	it('through object streams with nested dictionaries or hex-encoded data', async () => {
		const nested = await objectStreamPdf(JS_ACTION, { predictorColumns: 3 });
		expect(text(nested)).toContain('/DecodeParms << /Predictor 12 /Columns 3 >>');
		expect(codeOf(await inspectPdf(nested))).toBe('active_content');
		const hex = await objectStreamPdf(JS_ACTION, { filter: 'hex' });
		expect(text(hex)).toContain('/ASCIIHexDecode');
		expect(codeOf(await inspectPdf(hex))).toBe('active_content');
	});

	it('through strings that look like a stream around a live action', async () => {
		expect(codeOf(await inspectPdf(fakeStreamJavaScriptPdf()))).toBe('active_content');
	});

	it('and accepts the same object-stream file when its action only navigates', async () => {
		const bytes = await objectStreamPdf('<< /S /GoTo /D [3 0 R /Fit] >>', { predictorColumns: 4 });
		expect(await inspectPdf(bytes)).toMatchObject({ ok: true, pages: 1 });
	});

	it('refuses, with the "could not read every part" message, a file it had to repair', async () => {
		// A cross-reference table pointing 3 bytes off: readers guess, we do not.
		const good = rawPdf([
			'<< /Type /Catalog /Pages 2 0 R >>',
			'<< /Type /Pages /Kids [3 0 R] /Count 1 >>',
			'<< /Type /Page /Parent 2 0 R /MediaBox [0 0 200 200] >>'
		]);
		expect(await inspectPdf(good)).toMatchObject({ ok: true });
		const shifted = Buffer.from(text(good).replace('%PDF-1.7\n', '%PDF-1.7\n   '), 'latin1');
		const result = await inspectPdf(shifted);
		expect(codeOf(result)).toBe('unreadable');
		expect(result.ok ? '' : result.message).toMatch(/we could not read every part of this PDF/i);
	});
});
