import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import fontkit from '@pdf-lib/fontkit';
import type { PDFDocument, PDFFont } from 'pdf-lib';

// IBM Plex Sans from @fontsource, which ships WOFF and WOFF2 only. WOFF embedded with
// `subset: true` is the one combination that works with pdf-lib + fontkit: WOFF2 with
// subsetting crashes the process from a timer, and without subsetting either format embeds
// as a blank font. Only the latin subset is embedded (see `fitToFont` for everything else).
const FONT_FILES = {
	regular: '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff',
	semibold: '@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff'
} as const;

export type FontWeight = keyof typeof FONT_FILES;

export interface PlexFonts {
	regular: PDFFont;
	semibold: PDFFont;
}

// The font files are static package data, read once per process.
const fontBytesCache = new Map<FontWeight, Uint8Array>();

export function plexFontBytes(weight: FontWeight): Uint8Array {
	let bytes = fontBytesCache.get(weight);
	if (bytes === undefined) {
		const path = createRequire(import.meta.url).resolve(FONT_FILES[weight]);
		bytes = new Uint8Array(readFileSync(path));
		fontBytesCache.set(weight, bytes);
	}
	return bytes;
}

/** Embeds one weight into `doc` as a subset (only the glyphs drawn end up in the file). */
export async function embedPlexFont(doc: PDFDocument, weight: FontWeight): Promise<PDFFont> {
	doc.registerFontkit(fontkit);
	return doc.embedFont(plexFontBytes(weight), { subset: true });
}

export async function embedPlexFonts(doc: PDFDocument): Promise<PlexFonts> {
	const [regular, semibold] = await Promise.all([
		embedPlexFont(doc, 'regular'),
		embedPlexFont(doc, 'semibold')
	]);
	return { regular, semibold };
}

const characterSets = new WeakMap<PDFFont, Set<number>>();

function characterSetOf(font: PDFFont): Set<number> {
	let set = characterSets.get(font);
	if (set === undefined) {
		set = new Set(font.getCharacterSet());
		characterSets.set(font, set);
	}
	return set;
}

// Latin letters that Unicode does not decompose into a base letter plus a mark.
const BASE_LETTERS: Record<string, string> = {
	ł: 'l',
	Ł: 'L',
	đ: 'd',
	Đ: 'D',
	ħ: 'h',
	Ħ: 'H',
	ŧ: 't',
	Ŧ: 'T',
	ı: 'i',
	ŀ: 'l',
	Ŀ: 'L',
	ĸ: 'k',
	ŉ: 'n'
};

/** C0 and C1 control characters (line breaks, tabs, …) and the Unicode line separators. */
function isControl(segment: string): boolean {
	const code = segment.codePointAt(0) ?? 0;
	return code < 0x20 || (code >= 0x7f && code <= 0x9f) || code === 0x2028 || code === 0x2029;
}
const COMBINING_MARK = /\p{Mn}/u;

const graphemes = new Intl.Segmenter('en', { granularity: 'grapheme' });

/**
 * The text with every character the font cannot draw replaced, so drawing never fails and never
 * shows an empty box: line breaks and other control characters become spaces; a letter outside
 * the latin subset becomes its base letter where one exists ("Łucja" → "Lucja", "Dvořák" →
 * "Dvorak"); anything else (other scripts, an emoji however many code points it has) becomes
 * one "?".
 */
export function fitToFont(font: PDFFont, text: string): string {
	const supported = characterSetOf(font);
	const drawable = (value: string): boolean =>
		value.length > 0 && [...value].every((char) => supported.has(char.codePointAt(0) ?? 0));
	let out = '';
	for (const { segment } of graphemes.segment(text.normalize('NFC'))) {
		if (isControl(segment)) {
			out += ' ';
		} else if (drawable(segment)) {
			out += segment;
		} else {
			const base =
				BASE_LETTERS[segment] ??
				[...segment.normalize('NFKD')].filter((char) => !COMBINING_MARK.test(char)).join('');
			out += drawable(base) ? base : '?';
		}
	}
	return out;
}

/**
 * Splits already-fitted text into lines no wider than `maxWidth`, breaking at spaces where it
 * can and inside a word only when the word alone is wider than the line.
 */
export function wrapText(text: string, font: PDFFont, size: number, maxWidth: number): string[] {
	const fits = (value: string) => font.widthOfTextAtSize(value, size) <= maxWidth;
	const lines: string[] = [];
	let line = '';
	for (const word of text.split(/ +/)) {
		const candidate = line === '' ? word : `${line} ${word}`;
		if (fits(candidate)) {
			line = candidate;
			continue;
		}
		if (line !== '') lines.push(line);
		line = word;
		while (!fits(line) && line.length > 1) {
			let cut = line.length - 1;
			while (cut > 1 && !fits(line.slice(0, cut))) cut--;
			lines.push(line.slice(0, cut));
			line = line.slice(cut);
		}
	}
	if (line !== '' || lines.length === 0) lines.push(line);
	return lines;
}
