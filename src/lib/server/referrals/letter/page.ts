import { PDFDocument, rgb, type PDFFont, type PDFPage, type RGB } from 'pdf-lib';
import { type Outcome, type Site, type SiteMeasure } from '$lib/domain';
import { fitToFont, wrapText, type PlexFonts } from '../../documents/fonts';

// The referral letter an instructor's referral carries to the clinic: who, why, how urgent, the
// screening history as a chart and a table, the consent it was shared under, and the caution
// that a screening is not an assessment. A4, IBM Plex Sans, "Page n of N" on every page.

export interface LetterScreening {
	takenAt: Date | string;
	/** A site not recorded at this screening is shown as a dash. */
	sites: Partial<Record<Site, SiteMeasure>>;
	outcome: Outcome;
}

export interface ReferralLetterInput {
	referralId: string;
	createdAt: Date;
	/** Absent while the referral is a draft. */
	sentAt?: Date | null;
	client: {
		name: string;
		yearOfBirth?: number | null;
		/** Her position in care in words, e.g. "14 weeks postpartum". */
		stage: string;
	};
	referrer: { name: string; studio: string };
	clinic: { name: string; physio?: string | null };
	reason: string;
	urgency: 'routine' | 'soon';
	/** Red-flag labels as the product words them (RED_FLAG_LABELS). */
	redFlags: readonly string[];
	screenings: readonly LetterScreening[];
	consent: { id: string; givenAt: Date; scopes: readonly string[] };
	/** IANA zone for the dates printed; UTC when absent. */
	timeZone?: string;
	/** When the file is made (PDF creation date); now when absent. */
	generatedAt?: Date;
}

export const LETTER_CAUTION_TITLE = 'Screening is not a diagnosis';
export const LETTER_CAUTION =
	'Screening by a movement instructor is not a diagnosis or a clinical assessment. Refer pain, a bulge or lump, pelvic-floor symptoms or anything unexpected to a licensed health professional. Instructors work within their scope of practice and local regulations; clearances are set by the treating clinician.';

// Page geometry, in points (A4).
const PAGE: [number, number] = [595.28, 841.89];
export const MARGIN_X = 56;
const MARGIN_TOP = 54;
const MARGIN_BOTTOM = 64;
export const CONTENT_WIDTH = PAGE[0] - 2 * MARGIN_X;

function hex(value: string): RGB {
	const n = Number.parseInt(value.slice(1), 16);
	return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255);
}

// Seamwell's palette (tailwind.config.ts).
export const COLOURS = {
	ink: hex('#1f2a30'),
	inkSoft: hex('#4a5a62'),
	inkFaint: hex('#6b7b83'),
	tide: hex('#185955'),
	tideLight: hex('#d5ecea'),
	sand50: hex('#fbf8f3'),
	sand100: hex('#f4eee3'),
	sand200: hex('#e7dcc8'),
	grid: hex('#e3e7e8'),
	threshold: hex('#8a969c')
};

export const OUTCOME_STYLE: Record<Outcome, { label: string; colour: RGB }> = {
	within_limit: { label: 'Within limit', colour: hex('#1d6b4f') },
	monitor: { label: 'Monitor', colour: hex('#7a5200') },
	refer: { label: 'Refer', colour: hex('#9b2d20') }
};

export type Marker = 'circle' | 'square' | 'triangle';

/** Each site differs by colour, dash pattern and marker, so no one has to tell colours apart. */
export const SITE_STYLE: Record<Site, { colour: RGB; dash: number[]; marker: Marker }> = {
	above_navel: { colour: hex('#21706b'), dash: [], marker: 'circle' },
	at_navel: { colour: hex('#b0561a'), dash: [6, 3], marker: 'square' },
	below_navel: { colour: hex('#5b4a8f'), dash: [1.2, 2.6], marker: 'triangle' }
};

export const THRESHOLD_FINGERS = 2;

/** Short dashes are drawn with round caps so they read as dots. */
export function dotted(dash: readonly number[]): boolean {
	return (dash[0] ?? Infinity) < 2;
}

export const SCOPE_WORDS: Record<string, string> = {
	referral: 'the referral',
	screenings: 'her screening history',
	clearance: 'clearances back to the studio',
	documents: 'documents marked shareable'
};

export const MONTHS = [
	'Jan',
	'Feb',
	'Mar',
	'Apr',
	'May',
	'Jun',
	'Jul',
	'Aug',
	'Sep',
	'Oct',
	'Nov',
	'Dec'
];

function toDate(value: Date | string): Date {
	const date = typeof value === 'string' ? new Date(value) : value;
	if (Number.isNaN(date.getTime())) throw new RangeError(`Not a valid date: ${String(value)}`);
	return date;
}

/** Day, month and year of an instant in a zone, without relying on the locale's month names. */
export function dateParts(
	value: Date | string,
	timeZone: string
): { day: number; month: number; year: number } {
	const parts = new Intl.DateTimeFormat('en-GB', {
		timeZone,
		day: 'numeric',
		month: 'numeric',
		year: 'numeric'
	}).formatToParts(toDate(value));
	const part = (type: string) => Number(parts.find((p) => p.type === type)?.value);
	return { day: part('day'), month: part('month') - 1, year: part('year') };
}

/** "2 Dec 2026". */
export function formatLetterDate(value: Date | string, timeZone = 'UTC'): string {
	const { day, month, year } = dateParts(value, timeZone);
	return `${day} ${MONTHS[month]} ${year}`;
}

export function formatFingers(value: number): string {
	return Number.isInteger(value) ? String(value) : value.toFixed(1);
}

/** What was felt beyond the width, only where it departs from a shallow, firm, flat midline. */
export function findingsOf(measure: SiteMeasure): string {
	const findings: string[] = [];
	if (measure.depth !== 'shallow') findings.push(measure.depth);
	if (measure.tension === 'soft') findings.push('soft');
	if (measure.doming) findings.push('doming');
	return findings.join(', ');
}

interface TextStyle {
	font?: PDFFont;
	size?: number;
	colour?: RGB;
}

/** Lays the letter out top to bottom, starting a new page whenever the next block does not fit. */
export class LetterWriter {
	readonly pages: PDFPage[] = [];
	page!: PDFPage;
	y = 0;

	constructor(
		readonly doc: PDFDocument,
		readonly fonts: PlexFonts
	) {
		this.newPage();
	}

	newPage(): void {
		this.page = this.doc.addPage(PAGE);
		this.pages.push(this.page);
		this.y = PAGE[1] - MARGIN_TOP;
	}

	/** Starts a new page unless `height` more points fit above the bottom margin. */
	ensure(height: number): boolean {
		if (this.y - height >= MARGIN_BOTTOM) return false;
		this.newPage();
		return true;
	}

	fit(text: string, font: PDFFont = this.fonts.regular): string {
		return fitToFont(font, text);
	}

	width(text: string, style: TextStyle = {}): number {
		const font = style.font ?? this.fonts.regular;
		return font.widthOfTextAtSize(this.fit(text, font), style.size ?? 10);
	}

	/** Draws one line with its baseline at `y`. */
	text(text: string, x: number, y: number, style: TextStyle = {}, page = this.page): void {
		const font = style.font ?? this.fonts.regular;
		page.drawText(this.fit(text, font), {
			x,
			y,
			font,
			size: style.size ?? 10,
			color: style.colour ?? COLOURS.ink
		});
	}

	lines(text: string, maxWidth: number, style: TextStyle = {}): string[] {
		const font = style.font ?? this.fonts.regular;
		return wrapText(this.fit(text, font), font, style.size ?? 10, maxWidth);
	}

	/** A wrapped paragraph at the cursor, breaking across pages line by line. */
	paragraph(text: string, style: TextStyle = {}, indent = 0, after = 6): void {
		const size = style.size ?? 10;
		const leading = size * 1.45;
		for (const line of this.lines(text, CONTENT_WIDTH - indent, style)) {
			this.ensure(leading);
			this.y -= leading;
			this.text(line, MARGIN_X + indent, this.y + size * 0.3, style);
		}
		this.y -= after;
	}

	heading(text: string, keepWithNext = 60): void {
		this.ensure(28 + keepWithNext);
		this.y -= 22;
		this.text(text, MARGIN_X, this.y, {
			font: this.fonts.semibold,
			size: 12,
			colour: COLOURS.tide
		});
		this.y -= 8;
	}

	label(text: string, x: number, y: number): void {
		this.text(text.toUpperCase(), x, y, {
			font: this.fonts.semibold,
			size: 7.5,
			colour: COLOURS.inkFaint
		});
	}

	rule(y: number, colour: RGB = COLOURS.sand200, thickness = 0.75): void {
		this.page.drawLine({
			start: { x: MARGIN_X, y },
			end: { x: MARGIN_X + CONTENT_WIDTH, y },
			thickness,
			color: colour
		});
	}
}
