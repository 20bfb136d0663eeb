import { describe, expect, it } from 'vitest';
import {
	attachmentDisposition,
	cleanFileName,
	documentPatchSchema,
	readUploadForm
} from './schemas';

// Input handling for uploads and downloads: Seamwell's own rules (common practice, no source),
// with Content-Disposition's `filename*` from RFC 6266 / RFC 8187.

describe('cleanFileName', () => {
	it('keeps the name only as a label: no folders, no control characters', () => {
		expect(cleanFileName('../../etc/passwd.pdf')).toBe('passwd.pdf');
		expect(cleanFileName('C:\\Users\\ilse\\Assessment.pdf')).toBe('Assessment.pdf');
		expect(cleanFileName('Notes\u0000\u0007 12\nMay.pdf')).toBe('Notes 12May.pdf');
		expect(cleanFileName('   ')).toBe('document.pdf');
		expect(cleanFileName('..')).toBe('document.pdf');
		expect(cleanFileName('a'.repeat(300))).toHaveLength(200);
	});
});

describe('attachmentDisposition', () => {
	it('always says attachment, with an ASCII fallback and the exact name encoded', () => {
		expect(attachmentDisposition('Bewertung Łucja "final".pdf')).toBe(
			`attachment; filename="Bewertung _ucja _final_.pdf"; filename*=UTF-8''Bewertung%20%C5%81ucja%20%22final%22.pdf`
		);
	});
});

describe('readUploadForm', () => {
	const file = (name = 'a.pdf', body = '%PDF-') => new File([body], name);

	it('reads the file, the share (clinic by default) and a trimmed summary', async () => {
		const form = new FormData();
		form.set('file', file('dir/a.pdf'));
		form.set('summary', '  Hold impact work.  ');
		const parsed = await readUploadForm(form);
		expect(parsed.ok && parsed.data).toMatchObject({
			fileName: 'a.pdf',
			share: 'clinic',
			summary: 'Hold impact work.'
		});
	});

	it('names each bad field: no file chosen, an unknown share, a NUL in the summary', async () => {
		const form = new FormData();
		form.set('file', new File([], ''));
		form.set('share', 'everyone');
		form.set('summary', 'a\u0000b');
		const parsed = await readUploadForm(form);
		expect(parsed.ok).toBe(false);
		expect(!parsed.ok && parsed.errors.map((e) => e.pointer).sort()).toEqual([
			'/file',
			'/share',
			'/summary'
		]);
	});
});

describe('documentPatchSchema', () => {
	it('needs something to change; a blank summary clears it', () => {
		expect(documentPatchSchema.safeParse({}).success).toBe(false);
		expect(documentPatchSchema.parse({ summary: '  ' })).toEqual({ summary: null });
		expect(documentPatchSchema.parse({ share: 'studio' })).toEqual({ share: 'studio' });
		expect(documentPatchSchema.safeParse({ share: 'public' }).success).toBe(false);
	});
});
