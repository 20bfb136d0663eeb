import { describe, expect, it } from 'vitest';
import { formatMmEstimate } from './labels';

describe('formatMmEstimate', () => {
	it('shows 2 finger widths as about 30 mm at the default factor, labelled an estimate', () => {
		// Rett MT et al. 2009; Pitangui ACR et al. — one finger width ≈ 1.5 cm (approximate)
		expect(formatMmEstimate(2, 15)).toBe('≈ 30 mm, estimate at 15 mm per finger');
	});

	it('uses the examiner’s own factor and rounds to whole millimetres', () => {
		// common practice, no source — fingers differ, so each examiner may set her own factor;
		// 2.5 × 17.5 mm = 43.75 mm
		expect(formatMmEstimate(2.5, 17.5)).toBe('≈ 44 mm, estimate at 17.5 mm per finger');
		expect(formatMmEstimate(0, 17.5)).toBe('≈ 0 mm, estimate at 17.5 mm per finger');
	});
});
