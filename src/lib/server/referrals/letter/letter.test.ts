import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import type { Outcome, SiteMeasure } from '$lib/domain';
import { pdfText } from '../../../../../tests/fixtures/pdf';
import { inspectPdf } from '../../documents/pdf-check';
import {
	formatLetterDate,
	LETTER_CAUTION,
	type LetterScreening,
	type ReferralLetterInput
} from './page';
import { renderReferralLetter } from './render';

const words = (text: string) => text.replace(/\s+/g, ' ').trim();

/** The text of every page without its footer, so a paragraph reads on across a page break. */
function bodyText(pdf: Uint8Array, pages: number): string {
	const footer = /Seamwell referral letter ·|^\s*Page \d+ of \d+\s*$/;
	return words(
		Array.from({ length: pages }, (_, index) =>
			pdfText(pdf, index + 1)
				.split('\n')
				.filter((line) => !footer.test(line))
				.join('\n')
		).join('\n')
	);
}

function measure(widthFingers: number, extra: Partial<SiteMeasure> = {}): SiteMeasure {
	return { widthFingers, depth: 'shallow', tension: 'firm', doming: false, ...extra };
}

/** Demo screenings (invented): weekly, narrowing by half a finger width every few weeks. */
function screenings(count: number): LetterScreening[] {
	const start = Date.parse('2026-08-03T09:30:00Z');
	return Array.from({ length: count }, (_, i) => {
		const above = Math.max(0, 3.5 - Math.floor(i / 4) * 0.5);
		const outcome: Outcome = above >= 2 ? 'refer' : 'within_limit';
		return {
			takenAt: new Date(start + i * 7 * 86_400_000),
			sites: {
				above_navel: measure(above, i === 0 ? { widthMm: 31, depth: 'deep', doming: true } : {}),
				at_navel: measure(Math.max(0, above - 0.5)),
				below_navel: measure(Math.max(0, above - 1.5), { tension: 'soft' })
			},
			outcome
		};
	});
}

function letterInput(overrides: Partial<ReferralLetterInput> = {}): ReferralLetterInput {
	return {
		referralId: '7c1e9a40-2f3b-4d8e-9a61-5b0f2c8d4e17',
		createdAt: new Date('2026-11-30T09:00:00Z'),
		sentAt: new Date('2026-12-02T14:05:00Z'),
		client: { name: 'Maya Okonkwo', yearOfBirth: 1991, stage: '14 weeks postpartum' },
		referrer: { name: 'Tess Almeida', studio: 'Linden Row Studio' },
		clinic: { name: 'Harbourside Pelvic Health', physio: 'Priya Raman' },
		reason:
			'A gap of 3.5 finger widths above the navel at 14 weeks postpartum, with doming during the curl-up.',
		urgency: 'soon',
		redFlags: ['New or worse low back pain'],
		screenings: screenings(5),
		consent: {
			id: 'a2b4c6d8-1111-4222-8333-944455556666',
			givenAt: new Date('2026-11-28T12:00:00Z'),
			scopes: ['referral', 'screenings']
		},
		generatedAt: new Date('2026-12-02T14:05:30Z'),
		...overrides
	};
}

describe('renderReferralLetter', { timeout: 30_000 }, () => {
	// Rendering takes a few hundred milliseconds (font subsetting): share the plain letter.
	let plain: Promise<Uint8Array> | undefined;
	const plainLetter = () => (plain ??= renderReferralLetter(letterInput()));

	it('writes the parties, reason, urgency, red flags, sites, consent, caution and page numbers', async () => {
		const pdf = await plainLetter();
		const doc = await PDFDocument.load(pdf);
		const pages = doc.getPageCount();
		expect(pages).toBeGreaterThanOrEqual(1);

		const text = words(pdfText(pdf));
		for (const expected of [
			'Referral letter',
			'Maya Okonkwo',
			'Born 1991',
			'14 weeks postpartum',
			'Tess Almeida',
			'Linden Row Studio',
			'Harbourside Pelvic Health',
			'For Priya Raman',
			'A gap of 3.5 finger widths above the navel at 14 weeks postpartum, with doming during the curl-up.',
			'Soon',
			'New or worse low back pain',
			'Above the navel',
			'At the navel',
			'Below the navel',
			'2 finger widths',
			'3.5 (31 mm)',
			'deep, doming',
			'Refer',
			'Sent 2 Dec 2026',
			'5 screenings from 3 Aug 2026 to 31 Aug 2026',
			'consent reference a2b4c6d8-1111-4222-8333-944455556666',
			'the referral and her screening history',
			words(LETTER_CAUTION),
			`Page 1 of ${pages}`
		]) {
			expect(text).toContain(expected);
		}
		expect(text).toContain('Screening by a movement instructor is not a diagnosis');
		expect(text).toContain('scope of practice');
	});

	it('sets the PDF metadata', async () => {
		const doc = await PDFDocument.load(await plainLetter(), {
			updateMetadata: false
		});
		expect(doc.getTitle()).toBe('Referral letter 7c1e9a40-2f3b-4d8e-9a61-5b0f2c8d4e17');
		expect(doc.getProducer()).toBe('Seamwell');
		expect(doc.getCreator()).toBe('Seamwell');
		expect(doc.getCreationDate()?.toISOString()).toBe('2026-12-02T14:05:30.000Z');
	});

	it('paginates 40 screenings with "Page n of N" on every page, and every row present', async () => {
		const pdf = await renderReferralLetter(letterInput({ screenings: screenings(40) }));
		const pages = (await PDFDocument.load(pdf)).getPageCount();
		expect(pages).toBeGreaterThanOrEqual(2);
		for (let page = 1; page <= pages; page++) {
			expect(words(pdfText(pdf, page))).toContain(`Page ${page} of ${pages}`);
		}
		const text = words(pdfText(pdf));
		expect(text).toContain('Screening history (continued)');
		// Weekly from 3 Aug 2026: the 40th is 3 May 2027 (39 weeks later).
		for (const date of ['3 Aug 2026', '10 Aug 2026', '26 Apr 2027', '3 May 2027']) {
			expect(text).toContain(date);
		}
		expect(
			text.match(/\b\d{1,2} [A-Z][a-z]{2} 20\d\d (\S+ ){3,12}?(Refer|Within limit|Monitor)\b/g)
				?.length
		).toBe(40);
		// The letter's own output passes the upload checks.
		expect(await inspectPdf(pdf)).toMatchObject({ ok: true, pages });
	});

	it('wraps a long reason across lines and pages without losing words', async () => {
		const sentence = 'She reports a dragging feeling after long walks with the pram. ';
		const pdf = await renderReferralLetter(letterInput({ reason: sentence.repeat(80).trim() }));
		const pages = (await PDFDocument.load(pdf)).getPageCount();
		expect(pages).toBeGreaterThanOrEqual(2);
		const text = bodyText(pdf, pages);
		expect(text.split(sentence.trim()).length - 1).toBe(80);
		// The reason runs on to page 2 and the sections after it still follow.
		expect(words(pdfText(pdf, 2))).toContain('She reports a dragging feeling');
		expect(text).toContain('Urgency: Soon');
	});

	it('copes with no screenings, one screening, no red flags, a draft and unusual characters', async () => {
		const none = words(
			pdfText(
				await renderReferralLetter(
					letterInput({
						screenings: [],
						redFlags: [],
						sentAt: null,
						urgency: 'routine',
						clinic: { name: 'Harbourside Pelvic Health' },
						client: { name: 'Łucja 🌿 Nowak', stage: 'pregnant, 30 weeks' }
					})
				)
			)
		);
		expect(none).toContain('No screenings are recorded.');
		expect(none).toContain('None reported at screening.');
		expect(none).toContain('not yet sent');
		expect(none).toContain('Routine');
		expect(none).toContain('Any physiotherapist at the clinic');
		expect(none).toContain('Lucja ? Nowak');

		const one = words(
			pdfText(await renderReferralLetter(letterInput({ screenings: screenings(1) })))
		);
		expect(one).toContain('One screening on 3 Aug 2026');
	});
});

describe('formatLetterDate', () => {
	it('prints the day in the given zone', () => {
		const lateEvening = new Date('2026-12-02T23:30:00Z');
		expect(formatLetterDate(lateEvening)).toBe('2 Dec 2026');
		expect(formatLetterDate(lateEvening, 'Europe/Berlin')).toBe('3 Dec 2026');
		expect(() => formatLetterDate('not a date')).toThrow(RangeError);
	});
});
