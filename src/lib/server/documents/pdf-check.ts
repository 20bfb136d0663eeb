import { createHash } from 'node:crypto';
import {
	DEFAULT_QPDF_LIMITS,
	readPdf,
	type QpdfJson,
	type QpdfLimits,
	type QpdfValue
} from './qpdf';

// Checks an uploaded PDF before anyone else downloads it. Every refusal has a code for the
// program and a message for the person who uploaded the file.
//
// Decisions worth knowing:
// - End of file: the last thing in the file must be `%%EOF`, optionally followed by
//   end-of-line characters (CR and LF, any number, nothing else). ISO 32000-1 §7.5.5 puts
//   `%%EOF` on the last line, and most writers end that line with an EOL, so a final CR/LF is
//   part of a well-formed file; anything else after it (HTML, a ZIP, spaces, NULs) is refused
//   as trailing data, which is how polyglot files usually hide a second format.
// - The file is read by a real PDF parser, qpdf (./qpdf.ts): cross-reference streams, object
//   streams, every standard filter with its predictors, names with `#xx` escapes undone. A file
//   qpdf cannot read without a warning is refused: what we cannot read, we cannot vouch for.
// - Then every object is walked. Refused: any action but in-document navigation (`/GoTo`) —
//   so no JavaScript, launch, web or file links (`/URI`, `/GoToR`, `/GoToE`), form submission
//   or import, media, hiding or named actions — wherever it hangs (`/OpenAction`, `/A`, `/AA`,
//   `/Next`, name trees); embedded files; XFA forms; RichMedia and 3D annotations (they carry
//   scripts of their own). Downloads are also rebuilt without such entries (./disarm.ts), so a
//   miss here still never reaches a reader.

export interface PdfLimits {
	maxBytes: number;
	maxPages: number;
	/** Memory and time for the parser; tests lower them. */
	parser: QpdfLimits;
}

export const DEFAULT_PDF_LIMITS: PdfLimits = {
	maxBytes: 20 * 1024 * 1024,
	maxPages: 200,
	parser: DEFAULT_QPDF_LIMITS
};

export type PdfRefusalCode =
	| 'empty'
	| 'too_large'
	| 'not_pdf'
	| 'truncated'
	| 'trailing_data'
	| 'active_content'
	| 'embedded_file'
	| 'encrypted'
	| 'unreadable'
	| 'no_pages'
	| 'too_many_pages';

export type PdfInspection =
	| { ok: true; pages: number; sha256: string }
	| { ok: false; code: PdfRefusalCode; message: string };

function megabytes(bytes: number): string {
	return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}

function refuse(code: PdfRefusalCode, message: string): PdfInspection {
	return { ok: false, code, message };
}

/** ISO 32000-2 §12.6.4: every action type. All but /GoTo are refused. */
export const ACTION_TYPES = new Set([
	'/GoTo',
	'/GoToR',
	'/GoToE',
	'/GoToDp',
	'/Launch',
	'/Thread',
	'/URI',
	'/Sound',
	'/Movie',
	'/Hide',
	'/Named',
	'/SubmitForm',
	'/ResetForm',
	'/ImportData',
	'/JavaScript',
	'/SetOCGState',
	'/Rendition',
	'/Trans',
	'/GoTo3DView',
	'/RichMediaExecute'
]);

/** Keys whose value may be an action: link, widget and outline actions, open action, a link's former URI action. */
export const ACTION_KEYS = ['/A', '/OpenAction', '/PA'];
/** Keys that hold scripts or script-bearing forms wherever they appear. */
export const SCRIPT_KEYS = ['/JS', '/JavaScript', '/XFA', '/RichMediaContent'];
/** Annotation kinds that run content of their own. */
export const ACTIVE_SUBTYPES = new Set(['/RichMedia', '/3D']);
/** Keys and types that carry another file inside the PDF. */
export const EMBEDDED_KEYS = ['/EmbeddedFiles', '/EF'];

type Dict = { [key: string]: QpdfValue };
const REFERENCE = /^\d+ \d+ R$/;

function isDict(value: QpdfValue | undefined): value is Dict {
	return typeof value === 'object' && value !== null && !Array.isArray(value);
}

export interface PdfFindings {
	/** What runs or opens something, e.g. "/OpenAction /URI", "/AA", "/JS". */
	active: string[];
	embedded: string[];
}

/**
 * Walks every object qpdf read (each indirect object, stream dictionaries included, and the
 * trailer) and lists the entries this check refuses. Exported so tests can look at a rebuilt
 * download with the same eyes.
 */
export function findActiveContent(json: QpdfJson): PdfFindings {
	const objects = json.qpdf[1];
	const resolve = (value: QpdfValue | undefined): QpdfValue | undefined => {
		if (typeof value !== 'string' || !REFERENCE.test(value)) return value;
		const object = objects[`obj:${value}`];
		return object?.value ?? object?.stream?.dict ?? null;
	};
	const findings: PdfFindings = { active: [], embedded: [] };
	// An action is a dictionary with /S. A structure element's /A holds attributes (no /S).
	const isNavigation = (action: QpdfValue | undefined) =>
		!isDict(action) || action['/S'] === undefined || action['/S'] === '/GoTo';

	const visitDict = (dict: Dict): void => {
		const type = dict['/S'];
		if (typeof type === 'string' && ACTION_TYPES.has(type) && type !== '/GoTo') {
			findings.active.push(`action ${type}`);
		}
		if (dict['/Type'] === '/Action' && type !== '/GoTo') findings.active.push('an action');
		for (const key of ACTION_KEYS) {
			if (key in dict && !isNavigation(resolve(dict[key]))) findings.active.push(key);
		}
		const additional = resolve(dict['/AA']);
		if (isDict(additional)) {
			for (const [event, action] of Object.entries(additional)) {
				if (!isNavigation(resolve(action))) findings.active.push(`/AA ${event}`);
			}
		}
		for (const key of SCRIPT_KEYS) if (key in dict) findings.active.push(key);
		const subtype = dict['/Subtype'];
		if (typeof subtype === 'string' && ACTIVE_SUBTYPES.has(subtype)) findings.active.push(subtype);
		for (const key of EMBEDDED_KEYS) if (key in dict) findings.embedded.push(key);
		if (dict['/Type'] === '/EmbeddedFile') findings.embedded.push('/EmbeddedFile');
		if (subtype === '/FileAttachment') findings.embedded.push('/FileAttachment');
	};
	const visit = (value: QpdfValue | undefined): void => {
		if (Array.isArray(value)) {
			for (const item of value) visit(item);
		} else if (isDict(value)) {
			visitDict(value);
			for (const item of Object.values(value)) visit(item);
		}
	};
	for (const object of Object.values(objects)) {
		visit(object.value);
		if (object.stream) visit(object.stream.dict);
	}
	return findings;
}

const ACTIVE_MESSAGE =
	'This PDF contains scripts, links or actions that could run or open something on the reader’s computer (links to web pages or other files count too; only links within the document are allowed), so we cannot accept it. Please print it to a new PDF (or export it without interactive features) and upload that.';
const EMBEDDED_MESSAGE =
	'This PDF has other files attached inside it, which we cannot accept. Please remove the attachments, or print it to a new PDF, and upload that.';
const ENCRYPTED_MESSAGE =
	'This PDF is password-protected or encrypted, so we cannot check it or show it to others. Please save a copy without a password and upload that.';
export const UNREADABLE_MESSAGE =
	'We could not read every part of this PDF, so we cannot check it for safety; it may be damaged or made in an unusual way. Please save or export it again as a standard PDF and upload that.';

/** Strips CR and LF from the end; returns the index just past the last other byte. */
function contentEnd(bytes: Uint8Array): number {
	let end = bytes.length;
	while (end > 0 && (bytes[end - 1] === 0x0a || bytes[end - 1] === 0x0d)) end--;
	return end;
}

/**
 * Whether an uploaded file is a PDF we accept: not empty, within the size and page limits, a
 * complete PDF and nothing else, read whole by qpdf without a warning, unencrypted, with no
 * action but in-document navigation, no scripts and no attachments. On success, its page count
 * and SHA-256 (hex).
 */
export async function inspectPdf(
	bytes: Uint8Array,
	limits: Partial<PdfLimits> = {}
): Promise<PdfInspection> {
	const { maxBytes, maxPages, parser } = { ...DEFAULT_PDF_LIMITS, ...limits };
	const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);

	if (buffer.length === 0) {
		return refuse('empty', 'This file is empty. Please choose the PDF again and re-upload it.');
	}
	if (buffer.length > maxBytes) {
		return refuse(
			'too_large',
			`This file is ${megabytes(buffer.length)}; the limit is ${megabytes(maxBytes)}. Please upload a smaller PDF, for example by saving it with lower image quality.`
		);
	}
	if (!buffer.subarray(0, 5).equals(Buffer.from('%PDF-'))) {
		return refuse(
			'not_pdf',
			'This file is not a PDF, even if its name ends in .pdf. Please export or print the document as a PDF and upload that.'
		);
	}
	const end = contentEnd(buffer);
	if (!buffer.subarray(Math.max(end - 5, 0), end).equals(Buffer.from('%%EOF'))) {
		return buffer.lastIndexOf('%%EOF') === -1
			? refuse(
					'truncated',
					'This PDF is incomplete: its end is missing, perhaps because the download or copy was cut short. Please get the full file again and re-upload it.'
				)
			: refuse(
					'trailing_data',
					'This PDF has extra data after its end, which may hide another kind of file. Please save it again as a standard PDF and upload that.'
				);
	}

	const read = await readPdf(buffer, parser);
	if (read.kind === 'encrypted') return refuse('encrypted', ENCRYPTED_MESSAGE);
	if (read.kind === 'unreadable') return refuse('unreadable', UNREADABLE_MESSAGE);
	const findings = findActiveContent(read.json);
	if (findings.active.length > 0) return refuse('active_content', ACTIVE_MESSAGE);
	if (findings.embedded.length > 0) return refuse('embedded_file', EMBEDDED_MESSAGE);

	const pages = read.json.pages.length;
	if (pages < 1) {
		return refuse('no_pages', 'This PDF has no pages. Please check the file and upload it again.');
	}
	if (pages > maxPages) {
		return refuse(
			'too_many_pages',
			`This PDF has ${pages} pages; the limit is ${maxPages}. Please split it into smaller files and upload the part that is needed.`
		);
	}
	return { ok: true, pages, sha256: createHash('sha256').update(buffer).digest('hex') };
}
