import { describe, expect, it } from 'vitest';
import { effectiveLimits, NO_LIMIT_REASON } from './limits';
import { MOVEMENT_CATEGORIES } from './movement';
import {
	ALL_BUT_DEEP,
	BIRTH,
	addDays,
	clearance,
	held,
	measure,
	postpartum,
	pregnant,
	screening
} from './limits.fixtures';

// Movement limits without a clearance: weeks, the postnatal check, screenings, pregnancy
// and red flags. With a clearance: limits-clearance.test.ts.

describe('effectiveLimits — weeks after the birth, no clearance', () => {
	it('holds everything but deep stabilisation at 5 weeks 6 days, not at 6 weeks', () => {
		// UK CMO 2019 via NHS pages (secondary) — postnatal check at about 6–8 weeks before intensity
		const early = effectiveLimits(postpartum(), [], null, addDays(BIRTH, 41));
		expect(held(early)).toEqual(ALL_BUT_DEEP);
		expect(early.categories.deep_stability.level).toBe('no_limit');
		expect(early.categories.front_loaded).toMatchObject({ by: 'record' });
		expect(early.categories.front_loaded.reason).toContain('5 weeks after the birth');
		expect(early.categories.front_loaded.source).toContain('secondary source');
		// UK CMO 2019 — after childbirth, start gently
		expect(early.categories.front_loaded.source).toContain('start gently');
		expect(early.provisional).toBe(true);

		const six = effectiveLimits(postpartum(), [], null, addDays(BIRTH, 42));
		// Goom T et al. 2019 — impact still waits until 12 weeks
		expect(held(six)).toEqual(['impact']);
	});

	it('holds impact at 11 weeks 6 days, not at 12 weeks, after a vaginal birth', () => {
		// Goom T, Donnelly G, Brockwell E 2019 — return to running not before 3 months
		const eleven = effectiveLimits(postpartum(), [], null, addDays(BIRTH, 83));
		expect(held(eleven)).toEqual(['impact']);
		expect(eleven.categories.impact.source).toContain('Goom');
		expect(eleven.categories.impact.reason).toContain('11 weeks');

		const twelve = effectiveLimits(postpartum(), [], null, addDays(BIRTH, 84));
		expect(held(twelve)).toEqual([]);
	});

	it('also holds flexion, long-lever and high-pressure work under 12 weeks after a caesarean', () => {
		// common practice, from memory — after a caesarean hold these until about 12 weeks
		const client = postpartum({ delivery: 'caesarean' });
		const eleven = effectiveLimits(client, [], null, addDays(BIRTH, 83));
		expect(held(eleven)).toEqual(['loaded_flexion', 'long_lever', 'high_pressure', 'impact']);
		expect(eleven.categories.long_lever.source).toMatch(/^Common practice, from memory/);

		const twelve = effectiveLimits(client, [], null, addDays(BIRTH, 84));
		expect(held(twelve)).toEqual([]);

		// vaginal birth at the same 11 weeks: impact only (Goom 2019)
		expect(held(effectiveLimits(postpartum(), [], null, addDays(BIRTH, 83)))).toEqual(['impact']);
	});

	it('holds as after a caesarean when the type of birth is not recorded, and asks for it', () => {
		// common practice, from memory; the more cautious rule wins
		const limits = effectiveLimits(postpartum({ delivery: null }), [], null, addDays(BIRTH, 70));
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever', 'high_pressure', 'impact']);
		expect(limits.prompts.join(' ')).toContain('type of birth');
	});

	it('holds as in the first 6 weeks when the birth date is missing', () => {
		// UK CMO 2019 via NHS pages (secondary); cautious reading of an unknown date
		const limits = effectiveLimits(postpartum({ birthDate: null }), [], null, '2026-08-01');
		expect(held(limits)).toEqual(ALL_BUT_DEEP);
		expect(limits.prompts.join(' ')).toContain('birth date');
	});
});

describe('effectiveLimits — the postnatal check', () => {
	const today = addDays(BIRTH, 100); // 14 weeks: past every weeks-based hold

	it('holds everything but deep stabilisation when the check is recorded as not cleared', () => {
		// UK CMO 2019 via NHS pages (secondary)
		const limits = effectiveLimits(postpartum({ postnatalCleared: false }), [], null, today);
		expect(held(limits)).toEqual(ALL_BUT_DEEP);
		expect(limits.categories.impact.reason).toContain('not done or not cleared');
	});

	it('holds while the check is booked but not yet done', () => {
		// UK CMO 2019 via NHS pages (secondary)
		const client = postpartum({ postnatalCheckOn: addDays(today, 3), postnatalCleared: null });
		expect(held(effectiveLimits(client, [], null, today))).toEqual(ALL_BUT_DEEP);
	});

	it('holds nothing for an unknown check after 6 weeks, and prompts to record it', () => {
		// issue rule: unknown status after 6 weeks → no hold, a visible prompt (common practice, no source)
		const client = postpartum({ postnatalCheckOn: null, postnatalCleared: null });
		const limits = effectiveLimits(client, [], null, today);
		expect(held(limits)).toEqual([]);
		expect(limits.prompts).toHaveLength(1);
		expect(limits.prompts[0]).toContain('postnatal check');

		// before 6 weeks the weeks already hold; no prompt yet
		const early = effectiveLimits(client, [], null, addDays(BIRTH, 20));
		expect(early.prompts).toEqual([]);
	});

	it('prompts when the check happened but its result is not recorded', () => {
		const client = postpartum({ postnatalCheckOn: addDays(BIRTH, 45), postnatalCleared: null });
		const limits = effectiveLimits(client, [], null, today);
		expect(held(limits)).toEqual([]);
		expect(limits.prompts[0]).toContain('postnatal check');
	});
});

describe('effectiveLimits — screenings, no clearance', () => {
	const today = addDays(BIRTH, 100);
	const on = `${addDays(BIRTH, 95)}T10:00:00Z`;

	it('gives no_limit, never cleared, when nothing holds', () => {
		// Sperstad JB et al. 2016 — under 2 finger widths at every site is within limit
		const limits = effectiveLimits(
			postpartum(),
			[screening({ takenAt: on, sites: { at_navel: measure(1.5) } })],
			null,
			today
		);
		for (const category of MOVEMENT_CATEGORIES) {
			expect(limits.categories[category]).toMatchObject({
				level: 'no_limit',
				reason: NO_LIMIT_REASON,
				by: 'screening'
			});
			expect(limits.categories[category].source).not.toBe('');
		}
		expect(limits.provisional).toBe(true);
		// without any screening the level comes from the record
		expect(effectiveLimits(postpartum(), [], null, today).categories.impact.by).toBe('record');
	});

	it('holds loaded flexion and long-lever work after a refer outcome', () => {
		// Sperstad JB et al. 2016 — 2 finger widths refers; the holds: common practice, no source
		const limits = effectiveLimits(
			postpartum(),
			[screening({ takenAt: on, sites: { at_navel: measure(2) } })],
			null,
			today
		);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
		expect(limits.categories.loaded_flexion).toMatchObject({ by: 'screening' });
		expect(limits.categories.loaded_flexion.source).toMatch(/^Common practice/);
	});

	it('reads only the latest screening', () => {
		// Sperstad JB et al. 2016 — 1 finger width now is under the 2-finger threshold
		const limits = effectiveLimits(
			postpartum(),
			[
				screening({ takenAt: on, sites: { at_navel: measure(1) } }),
				screening({ takenAt: `${addDays(BIRTH, 60)}T10:00:00Z`, sites: { at_navel: measure(3) } })
			],
			null,
			today
		);
		expect(held(limits)).toEqual([]);
	});

	it('holds high-pressure effort and impact for pelvic heaviness or leakage', () => {
		// common practice, in line with Goom T et al. 2019
		for (const flag of ['pelvic_heaviness', 'leakage'] as const) {
			const limits = effectiveLimits(
				postpartum(),
				[screening({ takenAt: on, redFlags: [flag] })],
				null,
				today
			);
			expect(held(limits)).toEqual(['loaded_flexion', 'long_lever', 'high_pressure', 'impact']);
			expect(limits.categories.impact.source).toContain('in line with Goom');
		}
	});

	it('holds high-pressure effort for a painless midline bulge', () => {
		// Carlstedt A et al. 2020 — a suspected hernia needs imaging or surgical review
		const limits = effectiveLimits(
			postpartum(),
			[screening({ takenAt: on, redFlags: ['midline_bulge'] })],
			null,
			today
		);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever', 'high_pressure']);
		expect(limits.categories.high_pressure.source).toContain('Carlstedt');
		expect(limits.seeDoctorFirst).toBe(false);
	});

	it('holds everything, see doctor first, for a painful midline bulge', () => {
		// Carlstedt A et al. 2020; a painful bulge may be a hernia
		const limits = effectiveLimits(
			postpartum(),
			[screening({ takenAt: on, redFlags: ['midline_bulge', 'pain_on_effort'] })],
			null,
			today
		);
		expect(held(limits)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(limits.seeDoctorFirst).toBe(true);
	});

	it('combines holds on one category, most restrictive and every reason kept', () => {
		// common practice, from memory (caesarean) + common practice in line with Goom T et al. 2019
		const limits = effectiveLimits(
			postpartum({ delivery: 'caesarean' }),
			[screening({ takenAt: `${addDays(BIRTH, 70)}T10:00:00Z`, redFlags: ['leakage'] })],
			null,
			addDays(BIRTH, 72)
		);
		const high = limits.categories.high_pressure;
		expect(high.level).toBe('hold');
		expect(high.reason).toContain('leaking');
		expect(high.reason).toContain('caesarean');
		expect(high.source).toContain('in line with Goom');
		expect(high.source).toContain('from memory');
	});
});

describe('effectiveLimits — pregnancy, no clearance', () => {
	const today = '2026-06-01';
	const on = '2026-05-30T10:00:00Z';

	it('never holds anything for width alone', () => {
		// Mota P et al. 2015 — separation in every participant at gestation week 35
		const limits = effectiveLimits(
			pregnant(),
			[
				screening({
					takenAt: on,
					stage: 'pregnant',
					sites: { above_navel: measure(3), at_navel: measure(4), below_navel: measure(3) }
				})
			],
			null,
			today
		);
		expect(held(limits)).toEqual([]);
	});

	it('holds flexion and long-lever work for a deep gap or doming', () => {
		// common practice, no source (doming / deep gap in pregnancy)
		for (const site of [measure(1, { depth: 'deep' }), measure(1, { doming: true })]) {
			const limits = effectiveLimits(
				pregnant(),
				[screening({ takenAt: on, stage: 'pregnant', sites: { at_navel: site } })],
				null,
				today
			);
			expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
			expect(limits.categories.long_lever.source).toMatch(/^Common practice/);
		}
	});

	it('holds nothing for a soft midline alone', () => {
		// common practice: a soft midline in pregnancy is watched (monitor), not held
		const limits = effectiveLimits(
			pregnant(),
			[
				screening({
					takenAt: on,
					stage: 'pregnant',
					sites: { at_navel: measure(1, { tension: 'soft' }) }
				})
			],
			null,
			today
		);
		expect(held(limits)).toEqual([]);
	});
});

describe('effectiveLimits — a sign that sends her to a doctor', () => {
	const today = addDays(BIRTH, 100);
	const flagged = `${addDays(BIRTH, 90)}T10:00:00Z`;

	it('holds all nine, deep stabilisation too, after late bleeding', () => {
		// NICE CG37 table 5-1; Goom T et al. 2019 via NHS pages (secondary) — bleeding beyond 8 weeks
		const limits = effectiveLimits(
			postpartum(),
			[screening({ takenAt: flagged, redFlags: ['late_bleeding'] })],
			null,
			today
		);
		expect(held(limits)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(limits.seeDoctorFirst).toBe(true);
		for (const category of MOVEMENT_CATEGORIES) {
			expect(limits.categories[category].seeDoctorFirst).toBe(true);
			expect(limits.categories[category].reason).toMatch(/^See your doctor or midwife first/);
			expect(limits.categories[category].source).toContain('NICE CG37');
		}
	});

	it('holds all nine for a pregnancy warning sign, sourced from memory', () => {
		// from memory (ACOG CO 804, 2020)
		const limits = effectiveLimits(
			pregnant(),
			[screening({ takenAt: '2026-05-30T10:00:00Z', stage: 'pregnant', redFlags: ['dizziness'] })],
			null,
			'2026-06-01'
		);
		expect(held(limits)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(limits.categories.deep_stability.source).toContain('from memory');
	});

	it('holds all nine for a caesarean scar sign', () => {
		// common practice, from memory — scar pain, a bulge at the scar, wound infection
		const limits = effectiveLimits(
			postpartum({ delivery: 'caesarean' }),
			[screening({ takenAt: flagged, redFlags: ['scar_bulge'] })],
			null,
			today
		);
		expect(held(limits)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(limits.seeDoctorFirst).toBe(true);
	});

	it('stays on through a later screening that does not record the sign as resolved', () => {
		// NICE CG37 table 5-1 — lifted only when she was seen and the sign has gone
		const limits = effectiveLimits(
			postpartum(),
			[
				screening({ takenAt: flagged, redFlags: ['late_bleeding'] }),
				screening({ takenAt: `${addDays(BIRTH, 95)}T10:00:00Z` })
			],
			null,
			today
		);
		expect(limits.seeDoctorFirst).toBe(true);
	});

	it('lifts when a later screening records she was seen and the sign has gone', () => {
		// NICE CG37 table 5-1; 14 weeks vaginal, check cleared: nothing else holds (Goom 2019)
		const limits = effectiveLimits(
			postpartum(),
			[
				screening({ takenAt: flagged, redFlags: ['late_bleeding'] }),
				screening({ takenAt: `${addDays(BIRTH, 95)}T10:00:00Z`, medicalSignResolved: true })
			],
			null,
			today
		);
		expect(limits.seeDoctorFirst).toBe(false);
		expect(held(limits)).toEqual([]);
	});

	it('does not lift when the "resolved" screening records a medical sign of its own', () => {
		// NICE CG37 table 5-1 (signs of infection); scar signs: common practice, from memory
		const limits = effectiveLimits(
			postpartum(),
			[
				screening({ takenAt: flagged, redFlags: ['late_bleeding'] }),
				screening({
					takenAt: `${addDays(BIRTH, 95)}T10:00:00Z`,
					redFlags: ['wound_infection'],
					medicalSignResolved: true
				})
			],
			null,
			today
		);
		expect(limits.seeDoctorFirst).toBe(true);
		expect(limits.categories.impact.reason).toContain('Bleeding more than 8 weeks');
		expect(limits.categories.impact.reason).toContain('wound infection');
	});

	it('is lifted by a clearance set after it, not by one set before it', () => {
		// NICE CG37 table 5-1; the clinician's decision after the sign: common practice, no source
		const sign = screening({ takenAt: flagged, redFlags: ['late_bleeding'] });
		const after = clearance({ setAt: new Date(`${addDays(BIRTH, 92)}T12:00:00Z`) });
		const lifted = effectiveLimits(postpartum(), [sign], after, today);
		expect(lifted.seeDoctorFirst).toBe(false);
		expect(held(lifted)).toEqual([]);

		const before = clearance({ setAt: new Date(`${addDays(BIRTH, 85)}T12:00:00Z`) });
		const over = effectiveLimits(postpartum(), [sign], before, today);
		expect(over.seeDoctorFirst).toBe(true);
		expect(held(over)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(over.provisional).toBe(false);
		expect(over.newFindings).toEqual([
			expect.objectContaining({ kind: 'red_flag', flag: 'late_bleeding', screeningId: sign.id })
		]);
	});
});
