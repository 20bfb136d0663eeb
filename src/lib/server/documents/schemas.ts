import { z } from 'zod';
import type { FieldError } from '../http/problem';
import { text } from '../http/schemas';

// The inputs of the documents feature, shared by the JSON API and the referral page's forms.

export const DOCUMENT_SHARES = ['clinic', 'studio'] as const;
export type DocumentShare = (typeof DOCUMENT_SHARES)[number];

const share = z.enum(DOCUMENT_SHARES, { message: 'choose clinic or studio' });

/** Plain words for the instructor; blank means none. */
const summary = text(2000)
	.transform((s) => s.trim())
	.transform((s) => (s === '' ? null : s));

export const uploadFieldsSchema = z.object({
	share: share.default('clinic'),
	summary: summary.nullable().default(null)
});

export const documentPatchSchema = z
	.object({ share: share.optional(), summary: summary.nullable().optional() })
	.refine((patch) => patch.share !== undefined || patch.summary !== undefined, {
		message: 'say what to change: share, summary or both'
	});
export type DocumentPatch = z.infer<typeof documentPatchSchema>;

export interface UploadInput {
	bytes: Uint8Array;
	fileName: string;
	share: DocumentShare;
	summary: string | null;
}

/**
 * The name the file had, as a label only: no folders, no control characters, at most 200
 * characters. Never used to build a storage key or a path.
 */
export function cleanFileName(raw: string): string {
	const base = raw.split(/[\\/]/).at(-1) ?? '';
	const cleaned = base
		.normalize('NFC')
		// eslint-disable-next-line no-control-regex
		.replace(/[\u0000-\u001f\u007f-\u009f\u2028\u2029]/g, '')
		.replace(/\s+/g, ' ')
		.trim()
		.slice(0, 200);
	return cleaned === '' || cleaned === '.' || cleaned === '..' ? 'document.pdf' : cleaned;
}

export type UploadForm = { ok: true; data: UploadInput } | { ok: false; errors: FieldError[] };

const form = (value: FormDataEntryValue | null) => (typeof value === 'string' ? value : undefined);

/** Reads a multipart upload (fields `file`, `share`, `summary`). The file's contents are checked later, by the service. */
export async function readUploadForm(data: FormData): Promise<UploadForm> {
	const errors: FieldError[] = [];
	const file = data.get('file');
	// A form sent with no file chosen carries an empty, nameless part.
	if (!(file instanceof File) || (file.name === '' && file.size === 0)) {
		errors.push({ pointer: '/file', message: 'choose a PDF file to upload' });
	}
	const fields = uploadFieldsSchema.safeParse({
		share: form(data.get('share')) || undefined,
		summary: form(data.get('summary')) ?? null
	});
	if (!fields.success) {
		for (const issue of fields.error.issues) {
			errors.push({ pointer: `/${issue.path.join('/')}`, message: issue.message });
		}
	}
	if (errors.length > 0 || !(file instanceof File) || !fields.success) return { ok: false, errors };
	return {
		ok: true,
		data: {
			bytes: new Uint8Array(await file.arrayBuffer()),
			fileName: cleanFileName(file.name),
			share: fields.data.share,
			summary: fields.data.summary
		}
	};
}

/** `attachment` with an ASCII fallback name and the exact name in RFC 8187 encoding. */
export function attachmentDisposition(fileName: string): string {
	const fallback = fileName.replace(/[^A-Za-z0-9._ -]/g, '_') || 'document.pdf';
	const encoded = encodeURIComponent(fileName).replace(
		/['()*]/g,
		(c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`
	);
	return `attachment; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}

/** A PDF download: never shown inline, never sniffed, never cached. */
export function pdfAttachment(file: { bytes: Uint8Array; fileName: string }): Response {
	return new Response(Buffer.from(file.bytes), {
		status: 200,
		headers: {
			'Content-Type': 'application/pdf',
			'Content-Disposition': attachmentDisposition(file.fileName),
			'Content-Length': String(file.bytes.length),
			'X-Content-Type-Options': 'nosniff',
			'Cache-Control': 'no-store'
		}
	});
}
