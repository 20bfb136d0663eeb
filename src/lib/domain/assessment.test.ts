import { describe, expect, it } from 'vitest';
import {
	assessmentPointProblems,
	compareAssessment,
	compareMeasurementPoint,
	detectableChange,
	gradeMeasurementPoint,
	herniaAdvice,
	ULTRASOUND_MDC_MM,
	type AssessmentPoint
} from './assessment';
import { CRITERIA } from './criteria';

function point(overrides: Partial<AssessmentPoint>): AssessmentPoint {
	return { position: 'at', method: 'ultrasound', ...overrides };
}

function verdicts(p: AssessmentPoint): Array<[string, string, string]> {
	return compareMeasurementPoint(p).map((c) => [c.criterionId, c.state, c.verdict]);
}

describe('the criteria carry a state', () => {
	it('gives every criterion rest or curl-up, and marks recalled states', () => {
		for (const criterion of CRITERIA) {
			expect(['rest', 'curl_up']).toContain(criterion.state);
			expect(['verified', 'secondary', 'memory']).toContain(criterion.stateStatus);
		}
		// Sperstad JB et al. 2016 — finger widths during a curl-up
		expect(CRITERIA.find((c) => c.id === 'sperstad-2016-finger-width')?.state).toBe('curl_up');
	});
});

describe('compareMeasurementPoint — Beer et al. 2009 upper limits of normal (ultrasound, rest)', () => {
	it('keeps 15 mm at the xiphoid within, 16 mm above', () => {
		// Beer GM et al. Clin Anat 2009;22:706–711 — normal up to 15 mm at the xiphoid (inclusive)
		expect(verdicts(point({ position: 'xiphoid', restMm: 15 }))).toEqual([
			['beer-2009-xiphoid', 'rest', 'within'],
			['ehs-2021', 'rest', 'within']
		]);
		expect(verdicts(point({ position: 'xiphoid', restMm: 16 }))).toEqual([
			['beer-2009-xiphoid', 'rest', 'above'],
			['ehs-2021', 'rest', 'within']
		]);
	});

	it('keeps 22 mm 3 cm above the navel within, 23 mm above', () => {
		// Beer GM et al. 2009 — normal up to 22 mm 3 cm above the navel; Qu E et al. (2021, year
		// from memory) — > 14 mm 3 cm above; EHS 2021 — > 20 mm
		const at22 = compareMeasurementPoint(point({ position: 'above', distanceCm: 3, restMm: 22 }));
		expect(at22.map((c) => [c.criterionId, c.verdict])).toEqual([
			['beer-2009-above-3cm', 'within'],
			['ehs-2021', 'above'],
			['qu-2021-above-3cm', 'above']
		]);
		expect(at22[0]?.source).toContain('Beer GM');
		const at23 = compareMeasurementPoint(point({ position: 'above', distanceCm: 3, restMm: 23 }));
		expect(at23[0]).toMatchObject({ criterionId: 'beer-2009-above-3cm', verdict: 'above' });
	});

	it('keeps 16 mm 2 cm below the navel within, 17 mm above', () => {
		// Beer GM et al. 2009 — normal up to 16 mm 2 cm below; Mota P et al. 2015 — > 16 mm, with
		// exactly 16 mm unclear in the source
		const at16 = compareMeasurementPoint(point({ position: 'below', distanceCm: 2, restMm: 16 }));
		expect(at16.map((c) => [c.criterionId, c.verdict, c.boundaryUnclear])).toEqual([
			['beer-2009-below-2cm', 'within', false],
			['ehs-2021', 'within', false],
			['mota-2015-below-2cm', 'within', true]
		]);
		expect(
			verdicts(point({ position: 'below', distanceCm: 2, restMm: 17 })).map((v) => v[2])
		).toEqual(['above', 'within', 'above']);
	});

	it('matches a criterion only at its own point', () => {
		// Beer GM et al. 2009 — defined 3 cm above the navel; 3.5 cm is another point
		expect(verdicts(point({ position: 'above', distanceCm: 3.5, restMm: 23 }))).toEqual([
			['ehs-2021', 'rest', 'above']
		]);
		expect(verdicts(point({ position: 'above', distanceCm: 3.04, restMm: 23 }))[0]?.[0]).toBe(
			'beer-2009-above-3cm'
		);
	});

	it('matches a criterion only with its own method', () => {
		// Beer GM et al. 2009 — ultrasound; calipers meet only the EHS 2021 width definition
		expect(verdicts(point({ position: 'xiphoid', method: 'caliper', restMm: 16 }))).toEqual([
			['ehs-2021', 'rest', 'within']
		]);
	});

	it('compares a curl-up width only with curl-up criteria (none in mm)', () => {
		// Beer GM et al. 2009 — widths at rest (state from memory); Keshwani N et al. 2016 measured
		// both states, so a curl-up width is not a rest width
		expect(verdicts(point({ position: 'xiphoid', curlUpMm: 40 }))).toEqual([]);
		const both = compareMeasurementPoint(point({ position: 'xiphoid', restMm: 16, curlUpMm: 40 }));
		expect(both.every((c) => c.state === 'rest' && c.widthMm === 16)).toBe(true);
		expect(both[0]?.stateFromMemory).toBe(true);
	});

	it('leaves out the doubtful “> 2 mm at 3 cm below” criterion', () => {
		// Qu E et al. (2021, year from memory) — value as given in our references is doubtful
		expect(verdicts(point({ position: 'below', distanceCm: 3, restMm: 10 }))).toEqual([
			['ehs-2021', 'rest', 'within']
		]);
	});

	it('never compares palpation', () => {
		// Bursch SG. Phys Ther 1987 — raters differ; Benjamin DR et al. 2020 — finger width agrees
		// with ultrasound only within 18 mm
		for (const position of ['xiphoid', 'at'] as const) {
			expect(compareMeasurementPoint(point({ position, method: 'palpation', restMm: 40 }))).toEqual(
				[]
			);
		}
		expect(gradeMeasurementPoint(point({ method: 'palpation', restMm: 40 }))).toBeNull();
		const result = compareAssessment({
			points: [point({ method: 'palpation', restMm: 40 })],
			hernia: 'none'
		});
		expect(result.points[0]?.notes[0]).toContain('Bursch');
		expect(result.points[0]?.notes[0]).toContain('Benjamin');
	});
});

describe('EHS 2021 definition and Reinpold 2019 grade (rest width)', () => {
	it('counts 21 mm as rectus diastasis, not 20 mm', () => {
		// Hernández-Granados P et al. Br J Surg 2021 (EHS) — wider than 2 cm; 2.0 cm is not diastasis
		expect(verdicts(point({ method: 'caliper', restMm: 20 }))).toEqual([
			['ehs-2021', 'rest', 'within']
		]);
		expect(gradeMeasurementPoint(point({ method: 'caliper', restMm: 20 }))).toBeNull();
		expect(verdicts(point({ method: 'caliper', restMm: 21 }))).toEqual([
			['ehs-2021', 'rest', 'above']
		]);
		const grade = gradeMeasurementPoint(point({ method: 'caliper', restMm: 21 }));
		expect(grade?.definition.source).toContain('European Hernia Society');
		expect(grade?.reinpold.grade).toBe('W1');
	});

	it('grades 29 mm W1 and 30 mm W2', () => {
		// Reinpold W et al. Front Surg 2019 — W1 < 3 cm; W2 3 to ≤ 5 cm (3.0 cm is W2)
		expect(gradeMeasurementPoint(point({ restMm: 29 }))?.reinpold.grade).toBe('W1');
		expect(gradeMeasurementPoint(point({ restMm: 30 }))?.reinpold.grade).toBe('W2');
	});

	it('grades 50 mm W2 and 51 mm W3, W3 as a soft check from a secondary source', () => {
		// Reinpold W et al. 2019 — W2 to ≤ 5 cm (verified); W3 > 5 cm seen only in a secondary
		// source: a soft check
		const fifty = gradeMeasurementPoint(point({ restMm: 50 }));
		expect(fifty?.reinpold).toMatchObject({ grade: 'W2', secondarySource: false });
		const fiftyOne = gradeMeasurementPoint(point({ restMm: 51 }));
		expect(fiftyOne?.reinpold).toMatchObject({ grade: 'W3', secondarySource: true });
		expect(fiftyOne?.reinpold.source).toContain('secondary source');
	});

	it('grades only the rest width', () => {
		// Reinpold W et al. 2019; EHS 2021 — the definition is read at rest (state from memory)
		expect(gradeMeasurementPoint(point({ curlUpMm: 60 }))).toBeNull();
	});
});

describe('herniaAdvice', () => {
	it('sends a suspected or found hernia to imaging or surgical review', () => {
		// Carlstedt A et al. 2020 — a suspected hernia needs imaging or surgical review
		for (const finding of ['suspected', 'found'] as const) {
			const advice = herniaAdvice(finding);
			expect(advice?.detail).toContain('imaging or surgical review');
			expect(advice?.source).toContain('Carlstedt');
		}
		expect(herniaAdvice('none')).toBeNull();
	});
});

describe('detectableChange — ultrasound minimal detectable change', () => {
	it('uses the largest published figure, 1.97 cm, at every point', () => {
		// Keshwani N, Hills N, McLean L. Physiother Can 2016 — MDC 0.64–1.97 cm by point
		expect(ULTRASOUND_MDC_MM).toBe(19.7);
	});

	it('calls a change of 19.7 mm not detectable and 19.8 mm detectable', () => {
		// Keshwani N et al. 2016 — a change must exceed the MDC
		const before = point({ position: 'above', distanceCm: 3, restMm: 40, curlUpMm: 30 });
		const within = detectableChange(before, { ...before, restMm: 20.3, curlUpMm: 30 });
		expect(within.map((c) => [c.state, c.changeMm, c.detectable])).toEqual([
			['rest', -19.7, false],
			['curl_up', 0, false]
		]);
		const past = detectableChange(before, { ...before, restMm: 20.2 });
		expect(past[0]).toMatchObject({ state: 'rest', changeMm: -19.8, detectable: true });
		expect(past[0]?.source).toContain('Keshwani');
		expect(past[0]?.detail).toContain('narrower');
	});

	it('compares only ultrasound at the same point and state', () => {
		// Keshwani N et al. 2016 — an ultrasound figure; none published here for calipers
		const a = point({ position: 'below', distanceCm: 3, restMm: 60 });
		expect(detectableChange(a, { ...a, method: 'caliper', restMm: 20 })).toEqual([]);
		expect(detectableChange({ ...a, method: 'palpation' }, { ...a, restMm: 20 })).toEqual([]);
		expect(detectableChange(a, { ...a, distanceCm: 5, restMm: 20 })).toEqual([]);
		expect(detectableChange(a, { ...a, position: 'above', restMm: 20 })).toEqual([]);
		// a rest width and a curl-up width are never compared with each other
		expect(detectableChange(a, { ...a, restMm: null, curlUpMm: 20 })).toEqual([]);
	});
});

describe('assessmentPointProblems', () => {
	it('accepts the shapes the assessment form allows', () => {
		expect(assessmentPointProblems(point({ position: 'xiphoid', restMm: 10 }))).toEqual([]);
		expect(assessmentPointProblems(point({ distanceCm: 0, curlUpMm: 0 }))).toEqual([]);
		expect(
			assessmentPointProblems(point({ position: 'below', distanceCm: 15, restMm: 150 }))
		).toEqual([]);
	});

	it('refuses what the issue lists as bad input', () => {
		const fields = (p: AssessmentPoint) => assessmentPointProblems(p).map((x) => x.field);
		expect(fields(point({ position: 'xiphoid', distanceCm: 2, restMm: 10 }))).toEqual([
			'distanceCm'
		]);
		expect(fields(point({ position: 'at', distanceCm: 1, restMm: 10 }))).toEqual(['distanceCm']);
		expect(fields(point({ position: 'above', restMm: 10 }))).toEqual(['distanceCm']);
		expect(fields(point({ position: 'above', distanceCm: 0, restMm: 10 }))).toEqual(['distanceCm']);
		expect(fields(point({ position: 'above', distanceCm: 15.5, restMm: 10 }))).toEqual([
			'distanceCm'
		]);
		expect(fields(point({ restMm: 151 }))).toEqual(['restMm']);
		expect(fields(point({ curlUpMm: -1 }))).toEqual(['curlUpMm']);
		expect(fields(point({}))).toEqual(['restMm']);
		expect(() => compareMeasurementPoint(point({ restMm: 151 }))).toThrow(RangeError);
	});
});

describe('compareAssessment', () => {
	it('gathers comparisons, grade, notes and hernia advice per point', () => {
		// Beer GM et al. 2009; EHS 2021; Reinpold W et al. 2019; Carlstedt A et al. 2020
		const result = compareAssessment({
			points: [
				point({ position: 'above', distanceCm: 3, restMm: 32, curlUpMm: 25 }),
				point({ position: 'below', distanceCm: 4, method: 'caliper', curlUpMm: 12 })
			],
			hernia: 'suspected'
		});
		expect(result.points[0]?.label).toBe('3 cm above the navel');
		expect(result.points[0]?.grade?.reinpold.grade).toBe('W2');
		expect(result.points[0]?.comparisons.map((c) => c.criterionId)).toEqual([
			'beer-2009-above-3cm',
			'ehs-2021',
			'qu-2021-above-3cm'
		]);
		expect(result.points[1]?.comparisons).toEqual([]);
		expect(result.points[1]?.notes[0]).toContain('No published criterion matches');
		expect(result.hernia?.detail).toBe('Hernia suspected: imaging or surgical review.');
	});
});
