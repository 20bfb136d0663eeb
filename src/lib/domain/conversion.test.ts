import { describe, expect, it } from 'vitest';
import {
	DEFAULT_MM_PER_FINGER,
	fingersToMm,
	fingersToMmEstimate,
	mmToFingersEstimate
} from './conversion';

describe('finger-width conversion', () => {
	it('defaults to 15 mm per finger width', () => {
		// Rett MT et al. 2009; Pitangui ACR et al. — one finger width ≈ 1.5 cm (approximate)
		expect(DEFAULT_MM_PER_FINGER).toBe(15);
	});

	it('estimates 2 finger widths as 30 mm and labels it an estimate', () => {
		// Rett MT et al. 2009; Pitangui ACR et al. — one finger width ≈ 1.5 cm
		expect(fingersToMmEstimate(2)).toEqual({
			mm: 30,
			estimate: true,
			factor: 15,
			source: expect.stringContaining('Rett MT')
		});
		expect(fingersToMmEstimate(2).source).toContain('approximate');
	});

	it('uses the examiner’s own factor and says so', () => {
		// common practice, no source — fingers differ, so each examiner may set her own factor
		const estimate = fingersToMmEstimate(2.5, 18);
		expect(estimate.mm).toBe(45);
		expect(estimate.factor).toBe(18);
		expect(estimate.source).toContain('Examiner’s own factor of 18 mm');
	});

	it('estimates millimetres as finger widths, with the nearest half step', () => {
		// Rett MT et al. 2009 — ≈ 1.5 cm per finger; 22 mm ≈ 1.47 fingers
		const estimate = mmToFingersEstimate(22);
		expect(estimate.fingers).toBeCloseTo(22 / 15, 10);
		expect(estimate.fingersNearestHalf).toBe(1.5);
		expect(estimate.estimate).toBe(true);
		expect(mmToFingersEstimate(30).fingersNearestHalf).toBe(2);
		expect(mmToFingersEstimate(40, 20).fingers).toBe(2);
	});

	it('goes both ways with the same factor', () => {
		const mm = fingersToMmEstimate(3.5, 16).mm;
		expect(mmToFingersEstimate(mm, 16).fingers).toBe(3.5);
	});

	it('gives the millimetre figure alone, the same as the labelled estimate', () => {
		// Rett MT et al. 2009; Pitangui ACR et al. — one finger width ≈ 1.5 cm
		expect(fingersToMm(2)).toBe(30);
		// common practice, no source — the examiner's own factor
		expect(fingersToMm(2.5, 18)).toBe(fingersToMmEstimate(2.5, 18).mm);
	});

	it.each([0, -15, Number.NaN])('refuses a factor of %s', (factor) => {
		expect(() => fingersToMm(1, factor)).toThrow(RangeError);
		expect(() => fingersToMmEstimate(1, factor)).toThrow(RangeError);
		expect(() => mmToFingersEstimate(10, factor)).toThrow(RangeError);
	});

	it('refuses negative widths', () => {
		expect(() => fingersToMm(-1)).toThrow(RangeError);
		expect(() => fingersToMmEstimate(-1)).toThrow(RangeError);
		expect(() => mmToFingersEstimate(-1)).toThrow(RangeError);
	});
});
