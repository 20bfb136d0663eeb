import { describe, expect, it } from 'vitest';
import { formatFingerWidths, isValidFingerWidth, SITES, siteLabelCapitalised } from './sites';

describe('sites', () => {
	it('lists the three sites top to bottom', () => {
		expect(SITES).toEqual(['above_navel', 'at_navel', 'below_navel']);
	});

	it('capitalises a site label for the start of a sentence', () => {
		expect(siteLabelCapitalised('below_navel')).toBe('Below the navel');
	});
});

describe('isValidFingerWidth', () => {
	// Common practice, no source: the finger-width test reads in half fingers; 0–6 is the
	// product's recording range (DESIGN.md), wider than any gap a screening reports.
	it.each([0, 0.5, 2, 2.5, 6])('accepts %s (0–6 in half steps)', (value) => {
		expect(isValidFingerWidth(value)).toBe(true);
	});

	it.each([-0.5, 2.25, 6.5, Number.NaN, Number.POSITIVE_INFINITY])('refuses %s', (value) => {
		expect(isValidFingerWidth(value)).toBe(false);
	});
});

describe('formatFingerWidths', () => {
	it('uses the singular for one finger width only', () => {
		expect(formatFingerWidths(1)).toBe('1 finger width');
		expect(formatFingerWidths(1.5)).toBe('1.5 finger widths');
		expect(formatFingerWidths(0)).toBe('0 finger widths');
	});
});
