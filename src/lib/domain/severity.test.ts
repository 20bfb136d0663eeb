import { describe, expect, it } from 'vitest';
import { gradeSeverity } from './severity';

function grades(widthMm: number): [string, string | null] | null {
	const grade = gradeSeverity(widthMm);
	return grade && [grade.reinpold.grade, grade.keramidas.grade];
}

describe('gradeSeverity', () => {
	it('gives no grade at 20 mm or less', () => {
		// Hernández-Granados P et al. 2021 (EHS) — > 2 cm; 2.0 cm is not diastasis
		expect(gradeSeverity(20)).toBeNull();
		expect(gradeSeverity(19.9)).toBeNull();
		expect(gradeSeverity(0)).toBeNull();
	});

	it('grades 20.5 mm W1 and A', () => {
		// Hernández-Granados P et al. 2021 — past 2 cm; Reinpold W et al. 2019 — W1 < 3 cm;
		// Keramidas E et al. 2022 — A 2–3 cm
		expect(grades(20.5)).toEqual(['W1', 'A']);
		expect(grades(29.9)).toEqual(['W1', 'A']);
	});

	it('grades exactly 30 mm W2 and B', () => {
		// Reinpold W et al. 2019, Front Surg — W2 3 to ≤ 5 cm, 3.0 cm is W2;
		// Keramidas 2022 B 3–5 cm, 3.0 opening B is our reading
		expect(grades(30)).toEqual(['W2', 'B']);
	});

	it('grades exactly 50 mm W2 and B, and 50.5 mm W3 and C', () => {
		// Reinpold W et al. 2019 — W2 up to and including 5 cm; W3 > 5 cm (secondary source)
		// Keramidas 2022 — B 3–5, C 5–7 cm; 5.0 in B is our reading
		expect(grades(50)).toEqual(['W2', 'B']);
		expect(grades(50.5)).toEqual(['W3', 'C']);
	});

	it('reads Keramidas’s upper ends as belonging to the lower band', () => {
		// Keramidas E et al. 2022 — C 5–7 cm, D 7–9 cm; boundary reading is our own
		expect(grades(70)).toEqual(['W3', 'C']);
		expect(grades(70.5)).toEqual(['W3', 'D']);
		expect(grades(90)).toEqual(['W3', 'D']);
	});

	it('has no Keramidas grade beyond 9 cm', () => {
		// Keramidas E et al. 2022 — D ends at 9 cm
		const grade = gradeSeverity(95);
		expect(grade?.reinpold.grade).toBe('W3');
		expect(grade?.keramidas.grade).toBeNull();
		expect(grade?.keramidas.range).toContain('beyond');
	});

	it('adds the surgical-consideration note from 5 cm', () => {
		// Carlstedt A et al. 2020 — surgery considered only at ≥ 5 cm
		expect(gradeSeverity(49.9)?.notes).toEqual([]);
		expect(gradeSeverity(50)?.notes[0]).toContain('Carlstedt');
	});

	it('names its sources', () => {
		const grade = gradeSeverity(35);
		expect(grade?.reinpold.source).toContain('Reinpold W');
		expect(grade?.keramidas.source).toContain('Keramidas E');
		expect(grade?.widthMm).toBe(35);
	});

	it.each([-1, Number.NaN, Number.POSITIVE_INFINITY])('refuses %s', (width) => {
		expect(() => gradeSeverity(width)).toThrow(RangeError);
	});
});
