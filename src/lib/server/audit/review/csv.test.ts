import { describe, expect, it } from 'vitest';
import { csvLines, neutralise } from './csv';

// Quoting per RFC 4180 §2 (fields with commas, quotes or line breaks are enclosed in double
// quotes; a quote inside is doubled) and OWASP's CSV-injection advice (common practice, no
// published values).

describe('CSV cells', () => {
	it.each(['=HYPERLINK("x")', '+1', '-2+3', '@SUM(A1)', '\tx', '\rx'])('neutralises %j', (cell) => {
		expect(neutralise(cell)).toBe(`'${cell}`);
	});

	it('leaves ordinary text alone', () => {
		expect(neutralise('Hana Lindqvist')).toBe('Hana Lindqvist');
		expect(neutralise('a=b')).toBe('a=b');
	});

	it('quotes every field, doubles quotes and keeps line breaks inside quotes', () => {
		expect(csvLines([['a,b', 'say "hi"', 'two\nlines', null]])).toBe(
			'"a,b","say ""hi""","two\nlines",""\r\n'
		);
	});

	it('a formula-looking name comes out inert and quoted', () => {
		expect(csvLines([['=HYPERLINK("x")']])).toBe(`"'=HYPERLINK(""x"")"\r\n`);
	});
});
