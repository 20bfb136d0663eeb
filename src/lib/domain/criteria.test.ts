import { describe, expect, it } from 'vitest';
import {
	BEER_ABOVE_3CM,
	BEER_BELOW_2CM,
	BEER_XIPHOID,
	CRITERIA,
	criterionValueIn,
	EHS_2021,
	HILLS_2018,
	isPastCriterion,
	MOTA_BELOW_2CM,
	QU_ABOVE_3CM,
	QU_AT_NAVEL,
	QU_BELOW_3CM,
	SPERSTAD_FINGER_WIDTH,
	type Criterion
} from './criteria';

describe('criteria data', () => {
	it('has unique ids', () => {
		const ids = CRITERIA.map((criterion) => criterion.id);
		expect(new Set(ids).size).toBe(ids.length);
	});

	it('keeps `inclusive` in step with the comparison for every criterion', () => {
		for (const criterion of CRITERIA) {
			expect(criterion.inclusive, criterion.id).toBe(criterion.comparison === 'gte');
		}
	});

	it('gives distances exactly for criteria defined above or below the navel', () => {
		for (const criterion of CRITERIA) {
			const needsDistance = criterion.site === 'above_navel' || criterion.site === 'below_navel';
			if (needsDistance) expect(criterion.distanceCm, criterion.id).toBeGreaterThan(0);
		}
	});

	it('holds the finger-width rule: 2 finger widths or more, any site, palpation', () => {
		// Sperstad JB et al. 2016, Br J Sports Med; Gluppe SL et al. 2018 — ≥ 2 finger widths at any site
		expect(SPERSTAD_FINGER_WIDTH).toMatchObject({
			value: 2,
			unit: 'finger_widths',
			site: 'any',
			modality: 'palpation',
			comparison: 'gte'
		});
	});

	it('holds the Beer upper limits of normal at their own distances', () => {
		// Beer GM et al. 2009, Clin Anat — up to 15 mm xiphoid, 22 mm 3 cm above, 16 mm 2 cm below (90th pct)
		expect(
			[BEER_XIPHOID, BEER_ABOVE_3CM, BEER_BELOW_2CM].map((c) => [c.site, c.distanceCm, c.value])
		).toEqual([
			['xiphoid', null, 15],
			['above_navel', 3, 22],
			['below_navel', 2, 16]
		]);
		for (const criterion of [BEER_XIPHOID, BEER_ABOVE_3CM, BEER_BELOW_2CM]) {
			expect(criterion).toMatchObject({
				unit: 'mm',
				modality: 'ultrasound',
				comparison: 'gt',
				meaning: 'upper_limit_of_normal'
			});
		}
	});

	it('holds the EHS definition: wider than 20 mm', () => {
		// Hernández-Granados P et al. 2021, Br J Surg (EHS) — > 2 cm; 2.0 cm is not diastasis
		expect(EHS_2021).toMatchObject({ value: 20, unit: 'mm', comparison: 'gt', site: 'any' });
	});

	it('flags the Mota 16 mm boundary as unclear', () => {
		// Mota P et al. 2015, Man Ther — IRD > 16 mm 2 cm below; exactly 16 mm unclear
		expect(MOTA_BELOW_2CM).toMatchObject({
			value: 16,
			site: 'below_navel',
			distanceCm: 2,
			modality: 'ultrasound',
			comparison: 'gt',
			boundaryUnclear: true
		});
	});

	it('holds the Qu criteria as given in REFERENCES.md', () => {
		// Qu E et al. (2021, year from memory), Quant Imaging Med Surg — > 14 mm 3 cm above, > 20 at, > 2 mm 3 cm below
		expect(
			[QU_ABOVE_3CM, QU_AT_NAVEL, QU_BELOW_3CM].map((c) => [c.site, c.distanceCm, c.value])
		).toEqual([
			['above_navel', 3, 14],
			['at_navel', 0, 20],
			['below_navel', 3, 2]
		]);
		expect(QU_BELOW_3CM.note).toContain('check the original');
	});

	it('holds the Hills 1-year grouping, with no site to match', () => {
		// Hills NF et al. 2018, Phys Ther — IRD ≥ 2.2 cm at 1 year postpartum
		expect(HILLS_2018).toMatchObject({ value: 22, comparison: 'gte', site: 'unstated' });
	});
});

describe('isPastCriterion', () => {
	it('counts exactly 2 finger widths and not 1.5', () => {
		// Sperstad JB et al. 2016 — ≥ 2 finger widths, inclusive
		expect(isPastCriterion(SPERSTAD_FINGER_WIDTH, 2, 'finger_widths')).toBe(true);
		expect(isPastCriterion(SPERSTAD_FINGER_WIDTH, 1.5, 'finger_widths')).toBe(false);
	});

	it('does not count exactly 20 mm as diastasis, and counts 20.5', () => {
		// Hernández-Granados P et al. 2021 (EHS) — > 2 cm; 2.0 cm is not diastasis
		expect(isPastCriterion(EHS_2021, 20, 'mm')).toBe(false);
		expect(isPastCriterion(EHS_2021, 20.5, 'mm')).toBe(true);
	});

	it('counts exactly 22 mm in the Hills grouping', () => {
		// Hills NF et al. 2018 — ≥ 2.2 cm
		expect(isPastCriterion(HILLS_2018, 22, 'mm')).toBe(true);
		expect(isPastCriterion(HILLS_2018, 21.9, 'mm')).toBe(false);
	});
});

describe('criterionValueIn', () => {
	it('never turns a finger-width rule into millimetres', () => {
		// Bursch SG 1987, Phys Ther — finger-width scores differ between raters
		expect(() => criterionValueIn(SPERSTAD_FINGER_WIDTH, 'mm')).toThrow(TypeError);
		expect(() => criterionValueIn(EHS_2021, 'finger_widths')).toThrow(TypeError);
	});

	it('converts a criterion given in cm', () => {
		const inCm: Criterion = { ...EHS_2021, id: 'test-cm', value: 2, unit: 'cm' };
		expect(criterionValueIn(inCm, 'mm')).toBe(20);
		expect(isPastCriterion(inCm, 20, 'mm')).toBe(false);
		expect(isPastCriterion(inCm, 21, 'mm')).toBe(true);
	});
});
