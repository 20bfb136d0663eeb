import { scaleLinear, scaleTime } from 'd3-scale';
import { line } from 'd3-shape';
import { PDFDocument, rgb, LineCapStyle, type PDFFont, type PDFPage, type RGB } from 'pdf-lib';
import {
	chartSeries,
	sortByTime,
	SITES,
	siteLabelCapitalised,
	type ChartPoint,
	type Outcome,
	type Site,
	type SiteMeasure
} from '$lib/domain';
import { embedPlexFonts, fitToFont, wrapText, type PlexFonts } from './fonts';

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
const MARGIN_X = 56;
const MARGIN_TOP = 54;
const MARGIN_BOTTOM = 64;
const CONTENT_WIDTH = PAGE[0] - 2 * MARGIN_X;

function hex(value: string): RGB {
	const n = Number.parseInt(value.slice(1), 16);
	return rgb(((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255);
}

// Seamwell's palette (tailwind.config.ts).
const COLOURS = {
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

const OUTCOME_STYLE: Record<Outcome, { label: string; colour: RGB }> = {
	within_limit: { label: 'Within limit', colour: hex('#1d6b4f') },
	monitor: { label: 'Monitor', colour: hex('#7a5200') },
	refer: { label: 'Refer', colour: hex('#9b2d20') }
};

type Marker = 'circle' | 'square' | 'triangle';

/** Each site differs by colour, dash pattern and marker, so no one has to tell colours apart. */
const SITE_STYLE: Record<Site, { colour: RGB; dash: number[]; marker: Marker }> = {
	above_navel: { colour: hex('#21706b'), dash: [], marker: 'circle' },
	at_navel: { colour: hex('#b0561a'), dash: [6, 3], marker: 'square' },
	below_navel: { colour: hex('#5b4a8f'), dash: [1.2, 2.6], marker: 'triangle' }
};

const THRESHOLD_FINGERS = 2;

/** Short dashes are drawn with round caps so they read as dots. */
function dotted(dash: readonly number[]): boolean {
	return (dash[0] ?? Infinity) < 2;
}

const SCOPE_WORDS: Record<string, string> = {
	referral: 'the referral',
	screenings: 'her screening history',
	clearance: 'clearances back to the studio',
	documents: 'documents marked shareable'
};

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

function toDate(value: Date | string): Date {
	const date = typeof value === 'string' ? new Date(value) : value;
	if (Number.isNaN(date.getTime())) throw new RangeError(`Not a valid date: ${String(value)}`);
	return date;
}

/** Day, month and year of an instant in a zone, without relying on the locale's month names. */
function dateParts(
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

function formatFingers(value: number): string {
	return Number.isInteger(value) ? String(value) : value.toFixed(1);
}

/** What was felt beyond the width, only where it departs from a shallow, firm, flat midline. */
function findingsOf(measure: SiteMeasure): string {
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
class LetterWriter {
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

function drawHeader(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const { semibold } = w.fonts;
	w.text('Seamwell', MARGIN_X, w.y - 10, { font: semibold, size: 10, colour: COLOURS.tide });
	const ref = `Referral ${input.referralId}`;
	w.text(ref, MARGIN_X + CONTENT_WIDTH - w.width(ref, { size: 8 }), w.y - 10, {
		size: 8,
		colour: COLOURS.inkFaint
	});
	w.y -= 42;
	w.text('Referral letter', MARGIN_X, w.y, { font: semibold, size: 22 });
	w.y -= 18;
	const dates = input.sentAt
		? `Sent ${formatLetterDate(input.sentAt, tz)} · written ${formatLetterDate(input.createdAt, tz)}`
		: `Draft, written ${formatLetterDate(input.createdAt, tz)} — not yet sent`;
	w.text(`Pelvic-health physiotherapy · ${dates}`, MARGIN_X, w.y, {
		size: 9.5,
		colour: COLOURS.inkSoft
	});
	w.y -= 14;
	w.rule(w.y, COLOURS.tide, 1.2);
	w.y -= 6;
}

function drawParties(w: LetterWriter, input: ReferralLetterInput): void {
	const gap = 18;
	const columnWidth = (CONTENT_WIDTH - 2 * gap) / 3;
	const { client, referrer, clinic } = input;
	const columns: Array<{ label: string; lines: string[] }> = [
		{
			label: 'Client',
			lines: [
				client.name,
				...(client.yearOfBirth ? [`Born ${client.yearOfBirth}`] : []),
				client.stage
			]
		},
		{ label: 'Referred by', lines: [referrer.name, referrer.studio] },
		{
			label: 'Referred to',
			lines: [
				clinic.name,
				clinic.physio ? `For ${clinic.physio}` : 'Any physiotherapist at the clinic'
			]
		}
	];
	const size = 10;
	const leading = 14;
	const laidOut = columns.map((column) => ({
		label: column.label,
		lines: column.lines.map((text, index) =>
			w.lines(text, columnWidth, { size, font: index === 0 ? w.fonts.semibold : w.fonts.regular })
		)
	}));
	const height =
		16 + Math.max(...laidOut.map((column) => column.lines.flat().length)) * leading + 8;
	w.ensure(height + 20);
	w.y -= 20;
	const top = w.y;
	laidOut.forEach((column, index) => {
		const x = MARGIN_X + index * (columnWidth + gap);
		w.label(column.label, x, top);
		let y = top - 16;
		column.lines.forEach((wrapped, lineIndex) => {
			for (const text of wrapped) {
				w.text(text, x, y, {
					size,
					font: lineIndex === 0 ? w.fonts.semibold : w.fonts.regular,
					colour: lineIndex === 0 ? COLOURS.ink : COLOURS.inkSoft
				});
				y -= leading;
			}
		});
	});
	w.y = top - height;
	w.rule(w.y + 4);
}

function drawReason(w: LetterWriter, input: ReferralLetterInput): void {
	w.heading('Reason for referral');
	w.paragraph(input.reason, { size: 10 });

	w.ensure(22);
	w.y -= 16;
	w.text('Urgency:', MARGIN_X, w.y, { font: w.fonts.semibold, size: 10 });
	const urgency =
		input.urgency === 'soon'
			? { text: 'Soon — please offer an early appointment', colour: OUTCOME_STYLE.refer.colour }
			: { text: 'Routine', colour: COLOURS.ink };
	w.text(urgency.text, MARGIN_X + w.width('Urgency: ', { font: w.fonts.semibold }) + 2, w.y, {
		font: w.fonts.semibold,
		size: 10,
		colour: urgency.colour
	});
	w.y -= 6;

	w.heading('Red flags reported', 30);
	if (input.redFlags.length === 0) {
		w.paragraph('None reported at screening.', { colour: COLOURS.inkSoft });
		return;
	}
	for (const flag of input.redFlags) {
		const lines = w.lines(flag, CONTENT_WIDTH - 14);
		lines.forEach((text, index) => {
			w.ensure(15);
			w.y -= 14.5;
			if (index === 0) {
				w.page.drawRectangle({
					x: MARGIN_X + 2,
					y: w.y + 2,
					width: 4,
					height: 4,
					color: OUTCOME_STYLE.refer.colour
				});
			}
			w.text(text, MARGIN_X + 14, w.y);
		});
	}
	w.y -= 6;
}

function markerPath(marker: Marker, size: number): string | null {
	if (marker !== 'triangle') return null;
	const r = size * 1.25;
	return `M 0 ${-r} L ${r * 0.9} ${r * 0.6} L ${-r * 0.9} ${r * 0.6} Z`;
}

function drawMarker(page: PDFPage, marker: Marker, x: number, y: number, colour: RGB): void {
	const size = 3;
	if (marker === 'circle') {
		page.drawCircle({
			x,
			y,
			size: size * 0.8,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	} else if (marker === 'square') {
		const side = size * 1.5;
		page.drawRectangle({
			x: x - side / 2,
			y: y - side / 2,
			width: side,
			height: side,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	} else {
		// drawSvgPath places the path's origin at (x, y) and flips its y axis (SVG y points down).
		page.drawSvgPath(markerPath(marker, size) ?? '', {
			x,
			y,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	}
}

function formatTick(date: Date, spanDays: number, tz: string): string {
	const { day, month, year } = dateParts(date, tz);
	return spanDays > 300 ? `${MONTHS[month]} ${year}` : `${day} ${MONTHS[month]}`;
}

const DAY_MS = 86_400_000;

/**
 * Width per site over time. d3 scales give positions inside the plot in SVG orientation (origin
 * top left, y down); d3-shape turns each series into an SVG path, and pdf-lib's drawSvgPath puts
 * that path's origin at the plot's top-left corner and flips y, so the same numbers serve both
 * the paths and the markers (at plotTop − y).
 */
function drawChart(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const series = chartSeries(
		input.screenings.map((screening) => ({ takenAt: screening.takenAt, sites: screening.sites }))
	);
	const points = SITES.flatMap((site) => series[site]);
	if (points.length === 0) return;

	const legendHeight = 30;
	const plotHeight = 150;
	const axisHeight = 22;
	const total = legendHeight + plotHeight + axisHeight + 12;
	w.ensure(total);

	const left = MARGIN_X + 30;
	const plotWidth = CONTENT_WIDTH - 30;
	const legendTop = w.y - 6;
	const plotTop = legendTop - legendHeight;
	const page = w.page;

	const times = points.map((point) => new Date(point.t).getTime());
	let [start, end] = [Math.min(...times), Math.max(...times)];
	if (end - start < DAY_MS) {
		start -= 7 * DAY_MS;
		end += 7 * DAY_MS;
	}
	const x = scaleTime()
		.domain([new Date(start), new Date(end)])
		.range([10, plotWidth - 10]);
	const maxWidth = Math.max(...points.map((point) => point.fingers));
	const yMax = Math.min(6, Math.max(3, Math.ceil(maxWidth + 0.5)));
	const y = scaleLinear().domain([0, yMax]).range([plotHeight, 0]);

	// Grid and y axis, one line per finger width.
	for (let value = 0; value <= yMax; value++) {
		const py = plotTop - y(value);
		page.drawLine({
			start: { x: left, y: py },
			end: { x: left + plotWidth, y: py },
			thickness: value === 0 ? 0.8 : 0.5,
			color: value === 0 ? COLOURS.threshold : COLOURS.grid
		});
		const label = String(value);
		w.text(label, left - 6 - w.width(label, { size: 8 }), py - 2.8, {
			size: 8,
			colour: COLOURS.inkFaint
		});
	}
	w.text('finger widths', MARGIN_X, plotTop + 8, { size: 7.5, colour: COLOURS.inkFaint });

	// The 2-finger-width line: the common threshold for referring after the birth.
	const thresholdY = plotTop - y(THRESHOLD_FINGERS);
	page.drawLine({
		start: { x: left, y: thresholdY },
		end: { x: left + plotWidth, y: thresholdY },
		thickness: 0.9,
		color: COLOURS.threshold,
		dashArray: [4, 3]
	});

	// X axis ticks.
	const spanDays = (end - start) / DAY_MS;
	const ticks = x.ticks(Math.max(2, Math.min(6, Math.round(plotWidth / 80))));
	for (const tick of ticks) {
		const px = left + x(tick);
		page.drawLine({
			start: { x: px, y: plotTop - plotHeight },
			end: { x: px, y: plotTop - plotHeight - 3 },
			thickness: 0.6,
			color: COLOURS.threshold
		});
		const label = formatTick(tick, spanDays, tz);
		w.text(label, px - w.width(label, { size: 8 }) / 2, plotTop - plotHeight - 13, {
			size: 8,
			colour: COLOURS.inkFaint
		});
	}

	const path = line<ChartPoint>()
		.x((point) => x(new Date(point.t)))
		.y((point) => y(point.fingers));
	for (const site of SITES) {
		const style = SITE_STYLE[site];
		const data = series[site];
		const d = data.length > 1 ? path(data) : null;
		if (d) {
			page.drawSvgPath(d, {
				x: left,
				y: plotTop,
				borderColor: style.colour,
				borderWidth: 1.6,
				borderDashArray: style.dash,
				borderLineCap: dotted(style.dash) ? LineCapStyle.Round : LineCapStyle.Butt
			});
		}
		for (const point of data) {
			drawMarker(
				page,
				style.marker,
				left + x(new Date(point.t)),
				plotTop - y(point.fingers),
				style.colour
			);
		}
	}

	// Legend: a sample of each line with its marker, then the threshold line.
	let lx = left;
	const ly = legendTop - 12;
	for (const site of SITES) {
		const style = SITE_STYLE[site];
		page.drawLine({
			start: { x: lx, y: ly + 3 },
			end: { x: lx + 24, y: ly + 3 },
			thickness: 1.6,
			color: style.colour,
			dashArray: style.dash.length > 0 ? style.dash : undefined,
			lineCap: dotted(style.dash) ? LineCapStyle.Round : undefined
		});
		drawMarker(page, style.marker, lx + 12, ly + 3, style.colour);
		const label = siteLabelCapitalised(site);
		w.text(label, lx + 30, ly, { size: 8.5 });
		lx += 30 + w.width(label, { size: 8.5 }) + 16;
	}
	page.drawLine({
		start: { x: lx, y: ly + 3 },
		end: { x: lx + 24, y: ly + 3 },
		thickness: 0.9,
		color: COLOURS.threshold,
		dashArray: [4, 3]
	});
	w.text('2 finger widths', lx + 30, ly, { size: 8.5, colour: COLOURS.inkSoft });

	w.y = plotTop - plotHeight - axisHeight - 6;
}

interface Column {
	title: string;
	width: number;
}

function drawScreeningTable(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const screenings = sortByTime(input.screenings);
	const siteWidth = 104;
	const dateWidth = 84;
	const columns: Column[] = [
		{ title: 'Date', width: dateWidth },
		...SITES.map((site) => ({ title: siteLabelCapitalised(site), width: siteWidth })),
		{ title: 'Outcome', width: CONTENT_WIDTH - dateWidth - 3 * siteWidth }
	];
	const xs = columns.map((_, index) =>
		columns.slice(0, index).reduce((sum, column) => sum + column.width, MARGIN_X)
	);
	const pad = 6;
	const headerHeight = 30;

	const drawHead = () => {
		w.y -= headerHeight;
		w.page.drawRectangle({
			x: MARGIN_X,
			y: w.y,
			width: CONTENT_WIDTH,
			height: headerHeight,
			color: COLOURS.sand100
		});
		columns.forEach((column, index) => {
			const x = (xs[index] ?? MARGIN_X) + pad;
			w.text(column.title, x, w.y + 17, { font: w.fonts.semibold, size: 8.5 });
			if (index >= 1 && index <= 3) {
				w.text('finger widths', x, w.y + 7, { size: 7, colour: COLOURS.inkFaint });
			}
		});
	};

	w.ensure(headerHeight + 24);
	drawHead();

	screenings.forEach((screening, rowIndex) => {
		const cells = SITES.map((site) => {
			const measure = screening.sites[site];
			if (measure === undefined) return { main: '—', note: '' };
			const mm =
				measure.widthMm !== undefined && measure.widthMm !== null
					? ` (${Math.round(measure.widthMm)} mm)`
					: '';
			return { main: `${formatFingers(measure.widthFingers)}${mm}`, note: findingsOf(measure) };
		});
		const noteLines = cells.map((cell) =>
			cell.note ? w.lines(cell.note, siteWidth - 2 * pad, { size: 7.5 }) : []
		);
		const rowHeight = 18 + Math.max(0, ...noteLines.map((lines) => lines.length)) * 10;
		if (w.ensure(rowHeight)) {
			w.y -= 4;
			w.text('Screening history (continued)', MARGIN_X, w.y - 10, {
				font: w.fonts.semibold,
				size: 10,
				colour: COLOURS.tide
			});
			w.y -= 20;
			drawHead();
		}
		w.y -= rowHeight;
		if (rowIndex % 2 === 1) {
			w.page.drawRectangle({
				x: MARGIN_X,
				y: w.y,
				width: CONTENT_WIDTH,
				height: rowHeight,
				color: COLOURS.sand50
			});
		}
		const baseline = w.y + rowHeight - 12.5;
		w.text(formatLetterDate(screening.takenAt, tz), MARGIN_X + pad, baseline, { size: 9 });
		cells.forEach((cell, index) => {
			const x = (xs[index + 1] ?? MARGIN_X) + pad;
			w.text(cell.main, x, baseline, { size: 9 });
			(noteLines[index] ?? []).forEach((text, lineIndex) => {
				w.text(text, x, baseline - 10 * (lineIndex + 1), { size: 7.5, colour: COLOURS.inkSoft });
			});
		});
		const outcome = OUTCOME_STYLE[screening.outcome];
		w.text(outcome.label, (xs[4] ?? MARGIN_X) + pad, baseline, {
			font: w.fonts.semibold,
			size: 9,
			colour: outcome.colour
		});
		w.page.drawLine({
			start: { x: MARGIN_X, y: w.y },
			end: { x: MARGIN_X + CONTENT_WIDTH, y: w.y },
			thickness: 0.4,
			color: COLOURS.sand200
		});
	});
	w.y -= 8;
}

function drawScreenings(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	w.heading('Screening history', 260);
	const screenings = sortByTime(input.screenings);
	const first = screenings[0];
	const latest = screenings.at(-1);
	if (first === undefined || latest === undefined) {
		w.paragraph('No screenings are recorded.', { colour: COLOURS.inkSoft });
		return;
	}
	const count = screenings.length === 1 ? 'One screening' : `${screenings.length} screenings`;
	const span =
		screenings.length === 1
			? `on ${formatLetterDate(first.takenAt, tz)}`
			: `from ${formatLetterDate(first.takenAt, tz)} to ${formatLetterDate(latest.takenAt, tz)}`;
	w.paragraph(
		`${count} ${span}, felt during a head-and-shoulder curl-up. Millimetres appear only where measured; depth, a soft midline and doming are noted under the width.`,
		{ size: 9, colour: COLOURS.inkSoft }
	);
	drawChart(w, input, tz);
	drawScreeningTable(w, input, tz);
}

function drawConsent(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	w.heading('Consent to share', 40);
	const scopes = input.consent.scopes.map((scope) => SCOPE_WORDS[scope] ?? scope);
	const scopeText =
		scopes.length === 0
			? 'nothing yet (no scopes recorded)'
			: scopes.length === 1
				? (scopes[0] ?? '')
				: `${scopes.slice(0, -1).join(', ')} and ${scopes.at(-1) ?? ''}`;
	w.paragraph(
		`${input.client.name} gave consent on ${formatLetterDate(input.consent.givenAt, tz)} to share ${scopeText} between ${input.referrer.studio} and ${input.clinic.name} (consent reference ${input.consent.id}). She can withdraw it at any time; sharing then stops.`,
		{ size: 9.5 }
	);
}

function drawCaution(w: LetterWriter): void {
	const size = 9;
	const pad = 12;
	const lines = w.lines(LETTER_CAUTION, CONTENT_WIDTH - 2 * pad, { size });
	const height = pad + 14 + lines.length * 13 + pad - 4;
	w.ensure(height + 16);
	w.y -= 16;
	const top = w.y;
	w.y -= height;
	w.page.drawRectangle({
		x: MARGIN_X,
		y: w.y,
		width: CONTENT_WIDTH,
		height,
		color: COLOURS.sand100,
		borderColor: COLOURS.sand200,
		borderWidth: 0.8
	});
	w.text(LETTER_CAUTION_TITLE, MARGIN_X + pad, top - pad - 8, {
		font: w.fonts.semibold,
		size: 10
	});
	lines.forEach((text, index) => {
		w.text(text, MARGIN_X + pad, top - pad - 23 - index * 13, { size, colour: COLOURS.inkSoft });
	});
}

function drawFooters(w: LetterWriter, input: ReferralLetterInput): void {
	const total = w.pages.length;
	w.pages.forEach((page, index) => {
		const y = 34;
		page.drawLine({
			start: { x: MARGIN_X, y: y + 12 },
			end: { x: MARGIN_X + CONTENT_WIDTH, y: y + 12 },
			thickness: 0.5,
			color: COLOURS.sand200
		});
		const left = `Seamwell referral letter · ${input.referralId} · Confidential: health information`;
		w.text(left, MARGIN_X, y, { size: 7.5, colour: COLOURS.inkFaint }, page);
		const right = `Page ${index + 1} of ${total}`;
		w.text(
			right,
			MARGIN_X + CONTENT_WIDTH - w.width(right, { size: 8 }),
			y,
			{ size: 8, colour: COLOURS.inkSoft },
			page
		);
	});
}

/** The referral letter as a PDF (A4), paginated, with the fonts embedded as subsets. */
export async function renderReferralLetter(input: ReferralLetterInput): Promise<Uint8Array> {
	const tz = input.timeZone ?? 'UTC';
	const doc = await PDFDocument.create();
	const generatedAt = input.generatedAt ?? new Date();
	doc.setTitle(`Referral letter ${input.referralId}`);
	doc.setSubject('Referral for pelvic-health physiotherapy assessment');
	doc.setAuthor(`${input.referrer.name}, ${input.referrer.studio}`);
	doc.setCreator('Seamwell');
	doc.setProducer('Seamwell');
	doc.setCreationDate(generatedAt);
	doc.setModificationDate(generatedAt);
	doc.setLanguage('en-GB');

	const w = new LetterWriter(doc, await embedPlexFonts(doc));
	drawHeader(w, input, tz);
	drawParties(w, input);
	drawReason(w, input);
	drawScreenings(w, input, tz);
	drawConsent(w, input, tz);
	drawCaution(w);
	drawFooters(w, input);
	return doc.save();
}
