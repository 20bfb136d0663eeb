import { describe, expect, it } from 'vitest';
import {
	CAESAREAN_SCAR_SIGNS,
	EMERGENCY_SIGNS,
	isCaesareanScarSign,
	isPregnancyWarningSign,
	isRedFlag,
	PREGNANCY_WARNING_SIGNS,
	RED_FLAG_LABELS,
	RED_FLAG_REFER_TO,
	RED_FLAG_SOURCES,
	RED_FLAGS,
	redFlagsForStage,
	SYMPTOM_RED_FLAGS
} from './red-flags';
import { classifyScreening, referralTarget } from './screening';

describe('red flag lists', () => {
	it('holds every symptom flag and warning sign once', () => {
		expect(new Set(RED_FLAGS).size).toBe(RED_FLAGS.length);
		expect(RED_FLAGS).toHaveLength(
			SYMPTOM_RED_FLAGS.length +
				PREGNANCY_WARNING_SIGNS.length +
				CAESAREAN_SCAR_SIGNS.length +
				EMERGENCY_SIGNS.length
		);
	});

	it('labels every flag in plain words, not its code', () => {
		for (const flag of RED_FLAGS) {
			expect(RED_FLAG_LABELS[flag]).toMatch(/^[A-Z]/);
			expect(RED_FLAG_LABELS[flag]).not.toContain('_');
		}
	});

	it('offers late bleeding only after the birth', () => {
		// Goom T et al. 2019 via NHS pages (secondary) — bleeding beyond 8 weeks postnatal
		expect(redFlagsForStage('postpartum')).toContain('late_bleeding');
		expect(redFlagsForStage('pregnant')).not.toContain('late_bleeding');
	});

	it('offers the pregnancy warning signs only in pregnancy', () => {
		// from memory (ACOG CO 804, 2020) — warning signs during exercise in pregnancy
		const pregnant = redFlagsForStage('pregnant');
		const postpartum = redFlagsForStage('postpartum');
		for (const sign of PREGNANCY_WARNING_SIGNS) {
			expect(pregnant).toContain(sign);
			expect(postpartum).not.toContain(sign);
		}
	});

	it('offers the pelvic-floor and midline flags in both stages', () => {
		for (const flag of [
			'pelvic_heaviness',
			'leakage',
			'midline_bulge',
			'pain_on_effort'
		] as const) {
			expect(redFlagsForStage('pregnant')).toContain(flag);
			expect(redFlagsForStage('postpartum')).toContain(flag);
		}
	});

	it('sends late bleeding, every warning sign and every scar sign to a doctor, the rest to a physio', () => {
		// Goom T et al. 2019 (secondary); from memory (ACOG CO 804, 2020); caesarean scar signs:
		// common practice, from memory
		const medical = RED_FLAGS.filter((flag) => RED_FLAG_REFER_TO[flag] === 'medical');
		expect(medical).toEqual([
			'late_bleeding',
			...PREGNANCY_WARNING_SIGNS,
			...CAESAREAN_SCAR_SIGNS,
			...EMERGENCY_SIGNS
		]);
	});

	it('offers the caesarean scar signs only after the birth, sourced as common practice from memory', () => {
		// common practice, from memory — scar pain, a bulge at the scar, signs of wound infection
		expect(CAESAREAN_SCAR_SIGNS).toEqual(['scar_pain', 'scar_bulge', 'wound_infection']);
		for (const sign of CAESAREAN_SCAR_SIGNS) {
			expect(redFlagsForStage('postpartum')).toContain(sign);
			expect(redFlagsForStage('pregnant')).not.toContain(sign);
			expect(RED_FLAG_REFER_TO[sign]).toBe('medical');
			expect(RED_FLAG_SOURCES[sign]).toMatch(/^Common practice, from memory/);
			expect(isCaesareanScarSign(sign)).toBe(true);
		}
		expect(isCaesareanScarSign('midline_bulge')).toBe(false);
	});

	it('marks the pregnancy warning signs as recalled from memory', () => {
		for (const sign of PREGNANCY_WARNING_SIGNS) {
			expect(RED_FLAG_SOURCES[sign]).toContain('ACOG Committee Opinion 804 (2020)');
			expect(RED_FLAG_SOURCES[sign]).toContain('from memory');
		}
	});

	it('tells codes apart', () => {
		expect(isRedFlag('leakage')).toBe(true);
		expect(isRedFlag('sneezing')).toBe(false);
		expect(isPregnancyWarningSign('headache')).toBe(true);
		expect(isPregnancyWarningSign('leakage')).toBe(false);
	});

	it('classifies a scar sign with a narrow gap as a referral to a doctor', () => {
		// common practice, from memory — a caesarean scar sign sends her to a doctor whatever the width
		const site = { widthFingers: 1, depth: 'shallow', tension: 'firm', doming: false } as const;
		const result = classifyScreening({
			sites: { above_navel: site, at_navel: site, below_navel: site },
			redFlags: ['wound_infection'],
			context: { stage: 'postpartum', weeksPostpartum: 4 }
		});
		expect(result.outcome).toBe('refer');
		expect(referralTarget(result)).toBe('medical');
		expect(result.reasons[0]).toMatchObject({ flag: 'wound_infection', referTo: 'medical' });
		expect(result.reasons[0]?.detail).toContain('Signs of wound infection');
	});
});
