import { createHash } from 'node:crypto';
import { constants as zlibConstants, inflateSync } from 'node:zlib';
import {
	PDFArray,
	PDFDict,
	PDFDocument,
	PDFName,
	PDFStream,
	type PDFContext,
	type PDFObject
} from 'pdf-lib';

// Checks an uploaded PDF before anyone else downloads it. Every refusal has a code for the
// program and a message for the person who uploaded the file.
//
// Decisions worth knowing:
// - End of file: the last thing in the file must be `%%EOF`, optionally followed by
//   end-of-line characters (CR and LF, any number, nothing else). ISO 32000-1 §7.5.5 puts
//   `%%EOF` on the last line, and most writers end that line with an EOL, so a final CR/LF is
//   part of a well-formed file; anything else after it (HTML, a ZIP, spaces, NULs) is refused
//   as trailing data, which is how polyglot files usually hide a second format.
// - Active content and attachments are found by name tokens (`/JS`, `/Launch`, …) after
//   undoing `#xx` escapes, in three places: the file outside stream bodies, the decompressed
//   object streams (where modern writers keep dictionaries), and every dictionary pdf-lib
//   parses. Other stream bodies (page contents, images, fonts) are not scanned: names there
//   are never actions, and image pixels can spell `/JS` by chance.

export interface PdfLimits {
	maxBytes: number;
	maxPages: number;
}

export const DEFAULT_PDF_LIMITS: PdfLimits = { maxBytes: 20 * 1024 * 1024, maxPages: 200 };

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

/** Names that run something: scripts, launching programs, rich media, XML forms (which carry scripts). */
const ACTIVE_NAMES = new Set(['JS', 'JavaScript', 'Launch', 'RichMedia', 'XFA']);
/** Names that carry a file inside the PDF: the attachment stream, the list, the file-spec key. */
const EMBEDDED_NAMES = new Set(['EmbeddedFile', 'EmbeddedFiles', 'EF', 'FileAttachment']);

/** Per object stream, and over the whole file: decompressed bytes beyond this are a zip bomb. */
const MAX_INFLATED_STREAM = 32 * 1024 * 1024;
const MAX_INFLATED_TOTAL = 64 * 1024 * 1024;

function megabytes(bytes: number): string {
	return `${Math.round((bytes / (1024 * 1024)) * 10) / 10} MB`;
}

function refuse(code: PdfRefusalCode, message: string): PdfInspection {
	return { ok: false, code, message };
}

const ascii = new TextDecoder('latin1');

// PDF syntax (ISO 32000-1 §7.2.2): white-space and delimiter characters end a name.
const WHITESPACE = new Set([0x00, 0x09, 0x0a, 0x0c, 0x0d, 0x20]);
const DELIMITERS = new Set([0x28, 0x29, 0x3c, 0x3e, 0x5b, 0x5d, 0x7b, 0x7d, 0x2f, 0x25]);

function endsName(byte: number): boolean {
	return WHITESPACE.has(byte) || DELIMITERS.has(byte);
}

/** `/Java#53cript` → `JavaScript`; `#` with no two hex digits after it stays as it is. */
export function decodePdfName(raw: string): string {
	return raw.replace(/#([0-9a-fA-F]{2})/g, (_, hex: string) =>
		String.fromCharCode(Number.parseInt(hex, 16))
	);
}

/** Every name token in `bytes[from, to)`, decoded. */
function namesIn(bytes: Uint8Array, from = 0, to = bytes.length): string[] {
	const region = bytes.subarray(from, to);
	const names: string[] = [];
	let i = 0;
	for (;;) {
		const slash = region.indexOf(0x2f, i);
		if (slash === -1) break;
		let end = slash + 1;
		while (end < region.length && !endsName(region[end] ?? 0)) end++;
		if (end > slash + 1) names.push(decodePdfName(ascii.decode(region.subarray(slash + 1, end))));
		i = end;
	}
	return names;
}

interface StreamBody {
	/** The stream's dictionary, from its `<<` to the `stream` keyword. */
	dictStart: number;
	bodyStart: number;
	bodyEnd: number;
}

const STREAM = Buffer.from('stream');
const ENDSTREAM = Buffer.from('endstream');

function isWhitespace(byte: number | undefined): boolean {
	return byte !== undefined && WHITESPACE.has(byte);
}

/** A stream dictionary longer than this is not one a writer made. */
const MAX_DICT_SCAN = 64 * 1024;

/**
 * Where the dictionary ending with the `>>` whose last `>` is at `closing` begins, matching
 * nested `<< … >>` pairs, so `/DecodeParms << … >>` inside it does not cut it short.
 */
function dictionaryStart(bytes: Uint8Array, closing: number): number {
	let depth = 0;
	const limit = Math.max(closing - MAX_DICT_SCAN, 0);
	for (let i = closing; i > limit;) {
		const pair = bytes[i] === bytes[i - 1] ? bytes[i] : undefined;
		if (pair === 0x3e) {
			depth++;
			i -= 2;
		} else if (pair === 0x3c) {
			depth--;
			if (depth === 0) return i - 1;
			i -= 2;
		} else {
			i--;
		}
	}
	return limit;
}

/**
 * Where each stream's body lies. The body starts after `stream` and its end of line; it ends at
 * `/Length` bytes when that is a direct number landing on `endstream`, else at the next
 * `endstream`. A `stream` keyword not preceded by a dictionary's `>>` is not a stream.
 */
function findStreams(bytes: Buffer): StreamBody[] {
	const streams: StreamBody[] = [];
	let from = 0;
	for (;;) {
		const at = bytes.indexOf(STREAM, from);
		if (at === -1) break;
		from = at + STREAM.length;
		// `endstream` contains `stream`: skip it, and anything glued to other letters.
		const previousByte = bytes[at - 1];
		if (previousByte !== undefined && !isWhitespace(previousByte) && previousByte !== 0x3e)
			continue;
		let back = at - 1;
		while (back >= 0 && isWhitespace(bytes[back])) back--;
		if (bytes[back] !== 0x3e || bytes[back - 1] !== 0x3e) continue;
		let bodyStart = at + STREAM.length;
		if (bytes[bodyStart] === 0x0d) bodyStart++;
		if (bytes[bodyStart] === 0x0a) bodyStart++;
		const dictStart = dictionaryStart(bytes, back);
		const dictText = ascii.decode(bytes.subarray(dictStart, at));
		const length = /\/Length\s+(\d+)(?!\s+\d+\s+R)/.exec(dictText);
		let bodyEnd = -1;
		if (length?.[1] !== undefined) {
			const candidate = bodyStart + Number(length[1]);
			let probe = candidate;
			while (isWhitespace(bytes[probe])) probe++;
			if (bytes.subarray(probe, probe + ENDSTREAM.length).equals(ENDSTREAM)) bodyEnd = candidate;
		}
		if (bodyEnd === -1) {
			const next = bytes.indexOf(ENDSTREAM, bodyStart);
			if (next === -1) break;
			bodyEnd = next;
		}
		streams.push({ dictStart, bodyStart, bodyEnd });
		from = bodyEnd;
	}
	return streams;
}

export type NameScan =
	{ kind: 'names'; names: Set<string> } | { kind: 'failed'; code: PdfRefusalCode; message: string };

/**
 * Every name in the file as written, decoded: outside stream bodies, and inside object streams
 * (decompressed). An encrypted file's object streams are ciphertext, so they are not opened
 * once `/Encrypt` is seen. Exported for tests; `inspectPdf` is the check to call.
 */
export function scanPdfNames(bytes: Uint8Array): NameScan {
	const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const streams = findStreams(buffer);
	const names = new Set<string>();
	let cursor = 0;
	for (const stream of streams) {
		for (const name of namesIn(buffer, cursor, stream.bodyStart)) names.add(name);
		cursor = stream.bodyEnd;
	}
	for (const name of namesIn(buffer, cursor)) names.add(name);
	if (names.has('Encrypt')) return { kind: 'names', names };

	let inflatedTotal = 0;
	for (const stream of streams) {
		const dictNames = namesIn(buffer, stream.dictStart, stream.bodyStart);
		if (!dictNames.includes('ObjStm')) continue;
		const body = buffer.subarray(stream.bodyStart, stream.bodyEnd);
		const filters = dictNames.filter((name) => name !== 'Type' && name !== 'ObjStm');
		const flate = filters.includes('FlateDecode') || filters.includes('Fl');
		// A filter given indirectly (`/Filter 9 0 R`) names nothing here: treat it as unknown.
		const unknownFilter = filters.includes('Filter') && !flate;
		const otherFilter =
			unknownFilter ||
			filters.some((name) =>
				[
					'ASCIIHexDecode',
					'ASCII85Decode',
					'LZWDecode',
					'RunLengthDecode',
					'Crypt',
					'AHx',
					'A85',
					'LZW',
					'RL'
				].includes(name)
			);
		if (otherFilter) {
			return {
				kind: 'failed',
				code: 'unreadable',
				message:
					'Part of this PDF is packed in a way we cannot check for safety. Please save it again as a standard PDF and upload that.'
			};
		}
		let content: Uint8Array = body;
		if (flate) {
			try {
				content = inflateSync(body, {
					maxOutputLength: Math.min(MAX_INFLATED_STREAM, MAX_INFLATED_TOTAL - inflatedTotal),
					// Readers accept a stream cut short; scan whatever it holds.
					finishFlush: zlibConstants.Z_SYNC_FLUSH
				});
			} catch {
				return {
					kind: 'failed',
					code: 'unreadable',
					message:
						'Part of this PDF is damaged or unpacks to far more data than a document needs, so we cannot check it. Please save it again as a standard PDF and upload that.'
				};
			}
		}
		inflatedTotal += content.length;
		for (const name of namesIn(content)) names.add(name);
	}
	return { kind: 'names', names };
}

function refusalForNames(names: Set<string>): PdfInspection | null {
	if ([...names].some((name) => ACTIVE_NAMES.has(name))) {
		return refuse(
			'active_content',
			'This PDF contains scripts or actions that could run on the reader’s computer, so we cannot accept it. Please print it to a new PDF (or export it without interactive features) and upload that.'
		);
	}
	if ([...names].some((name) => EMBEDDED_NAMES.has(name))) {
		return refuse(
			'embedded_file',
			'This PDF has other files attached inside it, which we cannot accept. Please remove the attachments, or print it to a new PDF, and upload that.'
		);
	}
	return null;
}

const ENCRYPTED_MESSAGE =
	'This PDF is password-protected or encrypted, so we cannot check it or show it to others. Please save a copy without a password and upload that.';

/** Every name in every object pdf-lib parsed, keys and values, at any depth. */
function parsedNames(context: PDFContext): Set<string> {
	const names = new Set<string>();
	const seen = new Set<PDFObject>();
	const visit = (object: PDFObject | undefined): void => {
		if (object === undefined || seen.has(object)) return;
		seen.add(object);
		if (object instanceof PDFName) {
			names.add(object.decodeText());
		} else if (object instanceof PDFArray) {
			for (let i = 0; i < object.size(); i++) visit(object.get(i));
		} else if (object instanceof PDFDict) {
			for (const [key, value] of object.entries()) {
				visit(key);
				visit(value);
			}
		} else if (object instanceof PDFStream) {
			visit(object.dict);
		}
	};
	for (const [, object] of context.enumerateIndirectObjects()) visit(object);
	visit(context.trailerInfo.Encrypt);
	return names;
}

/** Strips CR and LF from the end; returns the index just past the last other byte. */
function contentEnd(bytes: Uint8Array): number {
	let end = bytes.length;
	while (end > 0 && (bytes[end - 1] === 0x0a || bytes[end - 1] === 0x0d)) end--;
	return end;
}

/**
 * Whether an uploaded file is a PDF we accept: not empty, within the size and page limits, a
 * complete PDF and nothing else, with no scripts, launch actions, attachments or encryption, and
 * readable by pdf-lib. On success, its page count and SHA-256 (hex).
 */
export async function inspectPdf(
	bytes: Uint8Array,
	limits: Partial<PdfLimits> = {}
): Promise<PdfInspection> {
	const { maxBytes, maxPages } = { ...DEFAULT_PDF_LIMITS, ...limits };
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

	const scan = scanPdfNames(buffer);
	if (scan.kind === 'failed') return refuse(scan.code, scan.message);
	const refusal = refusalForNames(scan.names);
	if (refusal !== null) return refusal;
	if (scan.names.has('Encrypt')) return refuse('encrypted', ENCRYPTED_MESSAGE);

	let doc: PDFDocument;
	try {
		doc = await PDFDocument.load(buffer, { updateMetadata: false, ignoreEncryption: true });
	} catch {
		return refuse(
			'unreadable',
			'We could not read this PDF; it may be damaged. Please save or export it again and re-upload it.'
		);
	}
	if (doc.isEncrypted) return refuse('encrypted', ENCRYPTED_MESSAGE);
	const parsedRefusal = refusalForNames(parsedNames(doc.context));
	if (parsedRefusal !== null) return parsedRefusal;

	let pages: number;
	try {
		pages = doc.getPageCount();
	} catch {
		return refuse(
			'unreadable',
			'We could not read the pages of this PDF; it may be damaged. Please save or export it again and re-upload it.'
		);
	}
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
