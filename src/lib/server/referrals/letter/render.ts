import { PDFDocument } from 'pdf-lib';
import { sortByTime } from '$lib/domain';
import { embedPlexFonts } from '../../documents/fonts';
import {
	COLOURS,
	CONTENT_WIDTH,
	LETTER_CAUTION,
	LETTER_CAUTION_TITLE,
	LetterWriter,
	MARGIN_X,
	type ReferralLetterInput,
	SCOPE_WORDS,
	formatLetterDate
} from './page';
import { drawHeader, drawParties, drawReason } from './parties';
import { drawChart } from './chart';
import { drawScreeningTable } from './table';

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
