import { describe, expect, it } from 'vitest';
import { effectiveLimits } from './limits';
import type { LimitsClient, LimitsSelfReport } from './movement';
import { checkPlan } from './plan-check';
import { SHIPPED_EXERCISES } from './exercises/exercise';
import { RED_FLAGS, type RedFlag } from './red-flags';
import {
	fingerCheckOffer,
	selfCheckAdvice,
	selfCheckSymptoms,
	SYMPTOM_URGENCY,
	SYMPTOM_URGENCY_SOURCES,
	WHO_SEES_IT,
	type AdviceLevel,
	type SelfCheckSite,
	type SelfCheckSites
} from './self-check';

function sites(overrides: Partial<SelfCheckSites> = {}, base: SelfCheckSite = plain(1)) {
	return { above_navel: base, at_navel: base, below_navel: base, ...overrides };
}
function plain(widthFingers: number, extra: Partial<SelfCheckSite> = {}): SelfCheckSite {
	return { widthFingers, deep: false, doming: false, ...extra };
}

/**
 * Each symptom's advice level, written out here rather than read from the table: emergency and
 * same-day from NICE CG37 postnatal care (its life-threatening signs — verified) and ACOG
 * Committee Opinion 804 (from memory); see_clinician from Goom et al. 2019 (secondary) and
 * common practice where marked.
 */
const EXPECTED: Record<RedFlag, AdviceLevel> = {
	heavy_bleeding: 'emergency', // NICE CG37: sudden or heavy bleeding
	chest_pain: 'emergency', // NICE CG37: chest pain
	breathless_before_effort: 'emergency', // NICE CG37: sudden breathlessness
	fluid_leaking: 'emergency', // ACOG CO 804, from memory: a gush of fluid before term
	painful_contractions: 'emergency', // ACOG CO 804, from memory: regular painful contractions
	reduced_fetal_movements: 'emergency', // common practice, from memory
	stuck_bulge: 'emergency', // common practice, from memory: a trapped hernia
	calf_pain_swelling: 'same_day', // NICE CG37: calf pain or swelling
	headache: 'same_day', // NICE CG37: severe headache
	wound_infection: 'same_day', // NICE CG37: fever, a red or weeping wound
	dizziness: 'same_day', // ACOG CO 804, from memory: fainting
	vaginal_bleeding: 'same_day', // ACOG CO 804, from memory: any bleeding in pregnancy
	muscle_weakness: 'same_day', // ACOG CO 804, from memory
	scar_pain: 'same_day', // common practice, from memory
	scar_bulge: 'same_day', // common practice, from memory
	pelvic_heaviness: 'see_clinician', // Goom et al. 2019 (secondary)
	leakage: 'see_clinician', // Goom et al. 2019 (secondary)
	midline_bulge: 'see_clinician', // Goom et al. 2019 (secondary): a painless bulge
	back_pain: 'see_clinician', // Goom et al. 2019 (secondary)
	pelvic_pain: 'see_clinician', // Goom et al. 2019 (secondary)
	late_bleeding: 'see_clinician', // Goom et al. 2019 (secondary): light bleeding after 8 weeks
	pain_on_effort: 'see_clinician' // common practice, no source
};

describe('selfCheckAdvice: every symptom', () => {
	for (const symptom of RED_FLAGS) {
		it(`${symptom} → ${EXPECTED[symptom]}, with its source, ending with who sees it`, () => {
			const advice = selfCheckAdvice({ symptoms: [symptom], sites: sites() });
			expect(advice.level).toBe(EXPECTED[symptom]);
			expect(SYMPTOM_URGENCY[symptom]).toBe(EXPECTED[symptom]);
			expect(advice.text.endsWith(WHO_SEES_IT)).toBe(true);
			expect(advice.sources.length).toBeGreaterThan(0);
			expect(SYMPTOM_URGENCY_SOURCES[symptom]).toMatch(/NICE|ACOG|Goom|Common practice/);
		});
	}

	it('the most urgent symptom decides, whatever the widths', () => {
		// NICE CG37: heavy bleeding is an emergency; leakage alone is a physiotherapist's (Goom 2019)
		const advice = selfCheckAdvice({
			symptoms: ['leakage', 'heavy_bleeding'],
			sites: sites({}, plain(4, { doming: true }))
		});
		expect(advice.level).toBe('emergency');
		expect(advice.text).toContain('emergency');
		expect(advice.because).toEqual(['Heavy bleeding or passing clots']);
	});
});

describe('selfCheckAdvice: the finger-width part', () => {
	it('1.5 finger widths everywhere → thanks; 2 at one place → show your instructor', () => {
		// Sperstad JB et al. 2016: ≥ 2 finger widths at any one of three sites (the trade's rule of thumb)
		expect(selfCheckAdvice({ symptoms: [], sites: sites({}, plain(1.5)) }).level).toBe('thanks');
		const two = selfCheckAdvice({ symptoms: [], sites: sites({ at_navel: plain(2) }) });
		expect(two.level).toBe('show_instructor');
		expect(two.sources.join(' ')).toContain('Sperstad');
		expect(two.text.endsWith(WHO_SEES_IT)).toBe(true);
	});

	it('deep at 1 finger width → show your instructor', () => {
		// Lee D, Hodges PW 2016 (linea alba distortion): depth matters even when narrow
		const advice = selfCheckAdvice({
			symptoms: [],
			sites: sites({ below_navel: plain(1, { deep: true }) })
		});
		expect(advice.level).toBe('show_instructor');
		expect(advice.sources.join(' ')).toContain('Lee D, Hodges PW');
	});

	it('doming at 1 finger width → show your instructor', () => {
		// common practice, no source: doming on effort calls for a look
		const advice = selfCheckAdvice({
			symptoms: [],
			sites: sites({ above_navel: plain(1, { doming: true }) })
		});
		expect(advice.level).toBe('show_instructor');
	});

	it('no sites and no symptoms → thanks', () => {
		expect(selfCheckAdvice({ symptoms: [] }).level).toBe('thanks');
	});
});

describe('fingerCheckOffer', () => {
	const today = '2026-06-01';
	const weeksAgo = (weeks: number) =>
		new Date(new Date(today).getTime() - weeks * 7 * 86_400_000).toISOString().slice(0, 10);

	it('is not offered in pregnancy (Mota 2015: a gap is expected late in pregnancy)', () => {
		const offer = fingerCheckOffer(
			{ stage: 'pregnant', birthDate: null, delivery: null, woundHealed: null },
			today
		);
		expect(offer).toMatchObject({ offered: false, why: 'pregnant' });
	});

	it('5 weeks after the birth: not yet; 6 weeks: offered (UK CMO 2019 via NHS: the postnatal check at about 6 weeks)', () => {
		const at = (weeks: number) =>
			fingerCheckOffer(
				{ stage: 'postpartum', birthDate: weeksAgo(weeks), delivery: 'vaginal', woundHealed: null },
				today
			);
		expect(at(5)).toMatchObject({ offered: false, why: 'too_early' });
		expect(at(6)).toEqual({ offered: true });
	});

	it('after a caesarean: asks about the wound, waits while healing, offers once healed (common practice, from memory)', () => {
		const base = { stage: 'postpartum', birthDate: weeksAgo(8), delivery: 'caesarean' } as const;
		expect(fingerCheckOffer({ ...base, woundHealed: null }, today)).toMatchObject({
			offered: false,
			why: 'ask_wound'
		});
		expect(fingerCheckOffer({ ...base, woundHealed: false }, today)).toMatchObject({
			offered: false,
			why: 'wound_healing'
		});
		expect(fingerCheckOffer({ ...base, woundHealed: true }, today)).toEqual({ offered: true });
	});

	it('the symptom list is always offered, the pregnancy signs in pregnancy', () => {
		expect(selfCheckSymptoms('pregnant')).toContain('reduced_fetal_movements');
		expect(selfCheckSymptoms('postpartum')).not.toContain('reduced_fetal_movements');
		// NICE CG37: calf pain and chest pain are postnatal signs too
		expect(selfCheckSymptoms('postpartum')).toContain('calf_pain_swelling');
		expect(selfCheckSymptoms('postpartum')[0]).toBe('chest_pain');
	});
});

describe('self-reported symptoms and effectiveLimits', () => {
	const today = '2026-09-01';
	const client: LimitsClient = {
		stage: 'postpartum',
		dueDate: null,
		birthDate: '2026-04-01',
		delivery: 'vaginal',
		postnatalCheckOn: '2026-05-15',
		postnatalCleared: true
	};
	const report = (symptoms: RedFlag[], takenAt = '2026-08-30T10:00:00Z'): LimitsSelfReport => ({
		id: `r-${takenAt}`,
		takenAt: new Date(takenAt),
		symptoms
	});

	it('holds nothing when her reports are not passed (she does not share), holds when passed', () => {
		// Goom et al. 2019 (secondary) + common practice: leakage holds high-pressure and impact
		const without = effectiveLimits(client, [], null, today);
		expect(without.categories.high_pressure.level).toBe('no_limit');
		const withReport = effectiveLimits(client, [], null, today, [report(['leakage'])]);
		expect(withReport.categories.high_pressure).toMatchObject({ level: 'hold', by: 'self_report' });
		expect(withReport.categories.impact.level).toBe('hold');
		expect(withReport.categories.loaded_flexion.reason).toContain('Self-reported');
		expect(withReport.categories.deep_stability.level).toBe('no_limit');
	});

	it('a same-day sign holds everything, see a doctor first', () => {
		// NICE CG37: calf pain or swelling needs a doctor
		const limits = effectiveLimits(client, [], null, today, [report(['calf_pain_swelling'])]);
		expect(limits.seeDoctorFirst).toBe(true);
		expect(limits.categories.deep_stability).toMatchObject({ level: 'hold', by: 'self_report' });
	});

	it('a later report without the symptom lifts a physiotherapist-level hold', () => {
		const limits = effectiveLimits(client, [], null, today, [
			report(['pelvic_heaviness'], '2026-08-20T10:00:00Z'),
			report([], '2026-08-30T10:00:00Z')
		]);
		expect(limits.categories.impact.level).toBe('no_limit');
	});

	it('her finger widths never change a limit: only symptoms are passed', () => {
		const limits = effectiveLimits(client, [], null, today, [report([])]);
		expect(limits).toEqual(effectiveLimits(client, [], null, today));
	});

	it('a home practice item in a held category is blocked by the same plan check', () => {
		const limits = effectiveLimits(client, [], null, today, [report(['leakage'])]);
		const impact = SHIPPED_EXERCISES.find((e) => e.categories.includes('impact'))!;
		const breathing = SHIPPED_EXERCISES.find(
			(e) => e.categories.length === 1 && e.categories[0] === 'deep_stability'
		)!;
		const cells = checkPlan(
			{ items: [{ exerciseId: impact.id }, { exerciseId: breathing.id }] },
			[{ clientId: 'c', stage: 'postpartum', limits }],
			SHIPPED_EXERCISES
		);
		expect(cells.map((c) => c.status)).toEqual(['blocked', 'ok']);
	});
});
