import { PDFDocument } from 'pdf-lib';
import { describe, expect, it } from 'vitest';
import { pdfText } from '../../../../tests/fixtures/pdf';
import { embedPlexFonts, fitToFont, plexFontBytes } from './fonts';

const WOFF_SIGNATURE = 'wOFF';

describe('plexFontBytes', () => {
	it('reads the WOFF files (not WOFF2) once', () => {
		for (const weight of ['regular', 'semibold'] as const) {
			const bytes = plexFontBytes(weight);
			expect(Buffer.from(bytes.subarray(0, 4)).toString('latin1')).toBe(WOFF_SIGNATURE);
			expect(plexFontBytes(weight)).toBe(bytes);
		}
		expect(plexFontBytes('regular')).not.toEqual(plexFontBytes('semibold'));
	});
});

describe('fitToFont', () => {
	it('keeps latin text, strips marks the subset lacks, and replaces the rest with one "?" each', async () => {
		const doc = await PDFDocument.create();
		const { regular } = await embedPlexFonts(doc);
		expect(fitToFont(regular, 'Zoë Müller-Øst, 2 Dec — “ok” €5')).toBe(
			'Zoë Müller-Øst, 2 Dec — “ok” €5'
		);
		expect(fitToFont(regular, 'Łucja Dvořák Şen')).toBe('Lucja Dvorák Sen');
		expect(fitToFont(regular, 'Ana 👍🏽 Иван')).toBe('Ana ? ????');
		expect(fitToFont(regular, 'family 👨‍👩‍👧 end')).toBe('family ? end');
		expect(fitToFont(regular, 'line one\r\nline\ttwo')).toBe('line one line two');
	});

	it('draws a name with ł and an emoji in both weights, and the text reads back', async () => {
		const doc = await PDFDocument.create();
		const fonts = await embedPlexFonts(doc);
		const page = doc.addPage([300, 100]);
		page.drawText(fitToFont(fonts.regular, 'Paweł 🌿 Nowak'), {
			x: 10,
			y: 60,
			size: 12,
			font: fonts.regular
		});
		page.drawText(fitToFont(fonts.semibold, 'Paweł 🌿 Nowak'), {
			x: 10,
			y: 30,
			size: 12,
			font: fonts.semibold
		});
		const text = pdfText(await doc.save());
		expect(text.match(/Pawel \? Nowak/g)).toHaveLength(2);
	});
});
