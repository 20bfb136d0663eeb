import { describe, expect, it } from 'vitest';
import { PREGNANCY_WARNING_SIGNS, type RedFlag } from './red-flags';
import { classifyScreening, referralTarget, type ScreeningInput } from './screening';
import type { Site, SiteMeasure } from './sites';
import type { StageContext } from './stage';

const POSTPARTUM: StageContext = { stage: 'postpartum', weeksPostpartum: 10 };
const PREGNANT: StageContext = { stage: 'pregnant', weeksOfGestation: 30 };

function measure(widthFingers: number, overrides: Partial<SiteMeasure> = {}): SiteMeasure {
	return { widthFingers, depth: 'shallow', tension: 'firm', doming: false, ...overrides };
}

function input(
	widths: Partial<Record<Site, SiteMeasure>>,
	context: StageContext = POSTPARTUM,
	redFlags: RedFlag[] = []
): ScreeningInput {
	return {
		sites: {
			above_navel: widths.above_navel ?? measure(1),
			at_navel: widths.at_navel ?? measure(1),
			below_navel: widths.below_navel ?? measure(1)
		},
		redFlags,
		context
	};
}

describe('classifyScreening — width after the birth', () => {
	it('refers to a physio at exactly 2 finger widths at one site', () => {
		// Sperstad JB et al. 2016, Br J Sports Med — ≥ 2 finger widths at any site (inclusive)
		const result = classifyScreening(input({ at_navel: measure(2) }));
		expect(result.outcome).toBe('refer');
		expect(result.reasons).toHaveLength(1);
		expect(result.reasons[0]).toMatchObject({
			code: 'width_at_or_over_threshold',
			effect: 'refer',
			referTo: 'physio',
			site: 'at_navel',
			criterionId: 'sperstad-2016-finger-width'
		});
		expect(result.reasons[0]?.source).toContain('Sperstad');
		expect(result.reasons[0]?.source).toContain('Gluppe');
	});

	it('keeps 1.5 finger widths at every site within limit', () => {
		// Sperstad JB et al. 2016 — under 2 finger widths is not diastasis
		const result = classifyScreening(
			input({ above_navel: measure(1.5), at_navel: measure(1.5), below_navel: measure(1.5) })
		);
		expect(result.outcome).toBe('within_limit');
		expect(result.reasons).toHaveLength(1);
		expect(result.reasons[0]?.code).toBe('all_sites_under_threshold');
		expect(result.reasons[0]?.referTo).toBeUndefined();
		expect(result.reasons[0]?.detail).toContain('1.5 finger widths above the navel');
	});

	it('refers when only one site reaches the threshold (OR across sites)', () => {
		// Sperstad JB et al. 2016; Gluppe SL et al. 2018 — any one of three sites
		const result = classifyScreening(input({ below_navel: measure(2.5) }));
		expect(result.outcome).toBe('refer');
		expect(result.reasons.map((reason) => reason.site)).toEqual(['below_navel']);
	});

	it('gives one reason per site that reaches the threshold', () => {
		// Sperstad JB et al. 2016 — ≥ 2 finger widths at any site
		const result = classifyScreening(
			input({ above_navel: measure(3), at_navel: measure(2), below_navel: measure(4) })
		);
		expect(result.reasons.map((reason) => reason.site)).toEqual([
			'above_navel',
			'at_navel',
			'below_navel'
		]);
	});

	it('names the site and width in plain words', () => {
		// Sperstad JB et al. 2016 — ≥ 2 finger widths at any site
		const [reason] = classifyScreening(input({ above_navel: measure(2.5) })).reasons;
		expect(reason?.detail).toContain('Above the navel');
		expect(reason?.detail).toContain('2.5 finger widths');
		expect(reason?.detail).toContain('physiotherapist');
	});

	it('judges by finger widths only, never by an instructor-entered mm width', () => {
		// Bursch SG 1987 / REFERENCES: compare a measurement only with a criterion of its own method
		const result = classifyScreening(input({ at_navel: measure(1, { widthMm: 40 }) }));
		expect(result.outcome).toBe('within_limit');
	});
});

describe('classifyScreening — depth, tension and doming', () => {
	it('refers a deep but narrow gap to a physio after the birth', () => {
		// common practice, informed by Lee & Hodges 2016 — a deep gap calls for a physio's look
		const result = classifyScreening(input({ at_navel: measure(1, { depth: 'deep' }) }));
		expect(result.outcome).toBe('refer');
		expect(result.reasons[0]).toMatchObject({
			code: 'deep_gap',
			referTo: 'physio',
			site: 'at_navel'
		});
		expect(result.reasons[0]?.source).toContain('Lee D, Hodges PW');
	});

	it('does not refer a moderate depth with a firm midline', () => {
		// common practice, no source — only a deep gap or a soft midline calls for a look
		const result = classifyScreening(input({ at_navel: measure(1, { depth: 'moderate' }) }));
		expect(result.outcome).toBe('within_limit');
	});

	it('refers a soft midline to a physio after the birth', () => {
		// common practice, informed by Lee & Hodges 2016 — a soft midline calls for a physio's look
		const result = classifyScreening(input({ above_navel: measure(0.5, { tension: 'soft' }) }));
		expect(result.outcome).toBe('refer');
		expect(result.reasons[0]).toMatchObject({
			code: 'soft_midline',
			referTo: 'physio',
			site: 'above_navel'
		});
	});

	it('refers doming to a physio after the birth, under its own code', () => {
		// common practice, no source — doming or coning along the midline on effort
		const result = classifyScreening(input({ below_navel: measure(1, { doming: true }) }));
		expect(result.outcome).toBe('refer');
		expect(result.reasons[0]).toMatchObject({
			code: 'doming',
			referTo: 'physio',
			site: 'below_navel'
		});
	});
});

describe('classifyScreening — pregnancy', () => {
	it('monitors the same 2-finger-width gap that refers after the birth', () => {
		// Mota P et al. 2015, Man Ther — separation present in every participant at week 35
		const widths = { at_navel: measure(2) };
		expect(classifyScreening(input(widths, POSTPARTUM)).outcome).toBe('refer');
		const pregnant = classifyScreening(input(widths, PREGNANT));
		expect(pregnant.outcome).toBe('monitor');
		expect(pregnant.reasons[0]).toMatchObject({
			code: 'width_expected_in_pregnancy',
			effect: 'monitor',
			site: 'at_navel'
		});
		expect(pregnant.reasons[0]?.referTo).toBeUndefined();
		expect(pregnant.reasons[0]?.source).toContain('Mota');
	});

	it('keeps a narrow gap in pregnancy within limit', () => {
		// Sperstad JB et al. 2016 — under 2 finger widths is not diastasis
		expect(classifyScreening(input({ at_navel: measure(1.5) }, PREGNANT)).outcome).toBe(
			'within_limit'
		);
	});

	it('monitors a deep, soft, doming midline in pregnancy and says why', () => {
		// Mota P et al. 2015 — a stretched midline is expected late in pregnancy
		const result = classifyScreening(
			input({ at_navel: measure(1, { depth: 'deep', tension: 'soft', doming: true }) }, PREGNANT)
		);
		expect(result.outcome).toBe('monitor');
		expect(result.reasons.map((reason) => reason.code)).toEqual([
			'deep_gap',
			'soft_midline',
			'doming'
		]);
		for (const reason of result.reasons) {
			expect(reason.effect).toBe('monitor');
			expect(reason.detail).toContain('in pregnancy');
		}
	});

	it('still refers on a red flag in pregnancy, whatever the width', () => {
		// Goom T et al. 2019 via NHS pages (secondary) — leaking calls for a referral
		const result = classifyScreening(input({ at_navel: measure(3) }, PREGNANT, ['leakage']));
		expect(result.outcome).toBe('refer');
		expect(referralTarget(result)).toBe('physio');
		expect(result.reasons.map((reason) => reason.effect)).toEqual(['refer', 'monitor']);
	});

	it('sends every pregnancy warning sign to medical care', () => {
		// from memory (ACOG CO 804, 2020) — warning signs to stop exercise and seek medical care
		for (const sign of PREGNANCY_WARNING_SIGNS) {
			const result = classifyScreening(input({}, PREGNANT, [sign]));
			expect(result.outcome).toBe('refer');
			expect(result.reasons[0]).toMatchObject({ code: 'red_flag', flag: sign, referTo: 'medical' });
			expect(result.reasons[0]?.detail).toContain('seek medical care');
			expect(result.reasons[0]?.source).toContain('from memory');
		}
	});
});

describe('classifyScreening — red flags', () => {
	it.each<RedFlag>(['pelvic_heaviness', 'leakage', 'back_pain', 'pelvic_pain', 'midline_bulge'])(
		'refers %s to a physio whatever the width',
		(flag) => {
			// Goom T et al. 2019 via NHS pages (secondary) — red flags for referral
			const result = classifyScreening(input({}, POSTPARTUM, [flag]));
			expect(result.outcome).toBe('refer');
			expect(result.reasons).toEqual([
				expect.objectContaining({ code: 'red_flag', flag, referTo: 'physio' })
			]);
		}
	);

	it('refers pain on effort to a physio', () => {
		// common practice, no source — pain calls for a referral whatever the width
		const result = classifyScreening(input({}, POSTPARTUM, ['pain_on_effort']));
		expect(referralTarget(result)).toBe('physio');
	});

	it('sends bleeding late after the birth to a doctor', () => {
		// Goom T et al. 2019 via NHS pages (secondary) — bleeding beyond 8 weeks postnatal
		const result = classifyScreening(input({}, POSTPARTUM, ['late_bleeding']));
		expect(result.reasons[0]).toMatchObject({ flag: 'late_bleeding', referTo: 'medical' });
		expect(result.reasons[0]?.detail).toContain('doctor');
	});

	it.each<RedFlag>(['pain_on_effort', 'pelvic_pain', 'back_pain'])(
		'sends a midline bulge with %s to a doctor as a painful bulge',
		(pain) => {
			// Carlstedt A et al. 2020 — a suspected hernia needs imaging or surgical review
			const result = classifyScreening(input({}, POSTPARTUM, ['midline_bulge', pain]));
			expect(referralTarget(result)).toBe('medical');
			expect(result.reasons[0]).toMatchObject({
				code: 'painful_midline_bulge',
				flag: 'midline_bulge',
				referTo: 'medical'
			});
			// the pain keeps its own physio reason; the bulge is not also listed as a plain flag
			expect(result.reasons.slice(1)).toEqual([
				expect.objectContaining({ code: 'red_flag', flag: pain, referTo: 'physio' })
			]);
		}
	);

	it('counts a flag recorded outside its usual stage', () => {
		// from memory (ACOG CO 804, 2020) — calf pain or swelling needs medical care
		const result = classifyScreening(input({}, POSTPARTUM, ['calf_pain_swelling']));
		expect(referralTarget(result)).toBe('medical');
	});

	it('gives one reason per flag even when a flag is repeated', () => {
		// Goom T et al. 2019 via NHS pages (secondary) — leaking calls for a referral
		const result = classifyScreening(input({}, POSTPARTUM, ['leakage', 'leakage']));
		expect(result.reasons).toHaveLength(1);
	});

	it('lists medical reasons first, then physio, then monitor', () => {
		// Sperstad JB et al. 2016 (width); Goom T et al. 2019 (flags) — ordering is our own
		const result = classifyScreening(
			input({ above_navel: measure(2) }, POSTPARTUM, ['leakage', 'late_bleeding'])
		);
		expect(result.reasons.map((reason) => reason.referTo)).toEqual(['medical', 'physio', 'physio']);
		expect(result.reasons.map((reason) => reason.flag ?? reason.site)).toEqual([
			'late_bleeding',
			'leakage',
			'above_navel'
		]);
	});

	it('gives every reason a detail and a source', () => {
		// REFERENCES.md — every classification names its source
		const result = classifyScreening(
			input(
				{ at_navel: measure(3, { depth: 'deep', tension: 'soft', doming: true }) },
				POSTPARTUM,
				['midline_bulge', 'pain_on_effort', 'leakage']
			)
		);
		for (const reason of result.reasons) {
			expect(reason.detail.length).toBeGreaterThan(20);
			expect(reason.source.length).toBeGreaterThan(20);
			if (reason.effect === 'refer') expect(reason.referTo).toBeDefined();
		}
	});
});

describe('classifyScreening — input checks', () => {
	it.each([2.25, -0.5, 6.5, Number.NaN])('refuses a finger width of %s', (width) => {
		expect(() => classifyScreening(input({ at_navel: measure(width) }))).toThrow(RangeError);
	});

	it('accepts the ends of the 0–6 scale', () => {
		expect(classifyScreening(input({ at_navel: measure(0) })).outcome).toBe('within_limit');
		expect(classifyScreening(input({ at_navel: measure(6) })).outcome).toBe('refer');
	});

	it('refuses a negative mm width', () => {
		expect(() => classifyScreening(input({ at_navel: measure(1, { widthMm: -1 }) }))).toThrow(
			RangeError
		);
	});
});

describe('referralTarget', () => {
	it('is null when nothing refers', () => {
		expect(referralTarget(classifyScreening(input({})))).toBeNull();
		expect(referralTarget(classifyScreening(input({ at_navel: measure(3) }, PREGNANT)))).toBeNull();
	});
});
