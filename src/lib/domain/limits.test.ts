import { describe, expect, it } from 'vitest';
import { effectiveLimits, NO_LIMIT_REASON } from './limits';
import {
	MOVEMENT_CATEGORIES,
	type ClearanceLevel,
	type EffectiveLimits,
	type LimitsClearance,
	type LimitsClient,
	type LimitsScreening,
	type MovementCategory
} from './movement';
import type { RedFlag } from './red-flags';
import { classifyScreening } from './screening';
import type { Site, SiteMeasure } from './sites';
import type { Stage } from './stage';

const BIRTH = '2026-04-01';

function addDays(day: string, days: number): string {
	return new Date(new Date(day).getTime() + days * 86_400_000).toISOString().slice(0, 10);
}

function postpartum(overrides: Partial<LimitsClient> = {}): LimitsClient {
	return {
		stage: 'postpartum',
		dueDate: null,
		birthDate: BIRTH,
		delivery: 'vaginal',
		postnatalCheckOn: addDays(BIRTH, 45),
		postnatalCleared: true,
		...overrides
	};
}

function pregnant(): LimitsClient {
	return {
		stage: 'pregnant',
		dueDate: '2026-09-01',
		birthDate: null,
		delivery: null,
		postnatalCheckOn: null,
		postnatalCleared: null
	};
}

function measure(widthFingers: number, overrides: Partial<SiteMeasure> = {}): SiteMeasure {
	return { widthFingers, depth: 'shallow', tension: 'firm', doming: false, ...overrides };
}

let nextId = 1;

/** A screening classified by the real rules, so outcome and reasons are what the studio stores. */
function screening(options: {
	takenAt: string;
	recordedAt?: string;
	stage?: Stage;
	sites?: Partial<Record<Site, SiteMeasure>>;
	redFlags?: RedFlag[];
	medicalSignResolved?: boolean;
}): LimitsScreening {
	const stage = options.stage ?? 'postpartum';
	const sites: Record<Site, SiteMeasure> = {
		above_navel: options.sites?.above_navel ?? measure(1),
		at_navel: options.sites?.at_navel ?? measure(1),
		below_navel: options.sites?.below_navel ?? measure(1)
	};
	const redFlags = options.redFlags ?? [];
	const result = classifyScreening({ sites, redFlags, context: { stage } });
	return {
		id: `s${nextId++}`,
		takenAt: new Date(options.takenAt),
		recordedAt: new Date(options.recordedAt ?? options.takenAt),
		stage,
		sites,
		redFlags,
		outcome: result.outcome,
		reasons: result.reasons,
		...(options.medicalSignResolved === undefined
			? {}
			: { medicalSignResolved: options.medicalSignResolved })
	};
}

function clearance(overrides: Partial<LimitsClearance> = {}): LimitsClearance {
	const setAt = overrides.setAt ?? new Date('2026-07-10T12:00:00Z');
	const levels = Object.fromEntries(
		MOVEMENT_CATEGORIES.map((category) => [category, 'cleared'])
	) as Record<MovementCategory, ClearanceLevel>;
	return {
		id: 'c1',
		stageAtSet: 'postpartum',
		modifications: {},
		reviewOn: '2026-09-01',
		setByName: 'Ines Varga',
		clinicName: 'Fernbank Pelvic Health',
		knownUntil: setAt,
		...overrides,
		setAt,
		levels: { ...levels, ...overrides.levels }
	};
}

function held(limits: EffectiveLimits): MovementCategory[] {
	return MOVEMENT_CATEGORIES.filter((category) => limits.categories[category].level === 'hold');
}

const ALL_BUT_DEEP = MOVEMENT_CATEGORIES.filter((category) => category !== 'deep_stability');

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

describe('effectiveLimits — with a clearance', () => {
	const setAt = new Date('2026-07-10T12:00:00Z');
	const today = '2026-07-20';
	const known = screening({
		takenAt: '2026-07-01T10:00:00Z',
		sites: { at_navel: measure(2), above_navel: measure(1.5) }
	});

	it('carries the clinician’s levels and modification text, over the studio’s own holds', () => {
		// common practice, no source: the studio never overrules a clinician
		const c = clearance({
			setAt,
			levels: { loaded_flexion: 'hold', front_loaded: 'modify' } as Record<
				MovementCategory,
				ClearanceLevel
			>,
			modifications: { front_loaded: 'Four-point kneeling only, no full plank' }
		});
		// 2026-07-20 is 15 weeks after the birth; a caesarean within 12 weeks would hold, but the
		// studio never overrules a clinician: her levels stand.
		const limits = effectiveLimits(
			postpartum({ delivery: 'caesarean', birthDate: '2026-05-10' }),
			[known],
			c,
			today
		);
		expect(limits.provisional).toBe(false);
		expect(limits.categories.loaded_flexion).toMatchObject({ level: 'hold', by: 'clinician' });
		expect(limits.categories.front_loaded).toMatchObject({
			level: 'modify',
			by: 'clinician',
			modification: 'Four-point kneeling only, no full plank'
		});
		expect(limits.categories.front_loaded.reason).toContain('Four-point kneeling only');
		expect(limits.categories.impact).toMatchObject({ level: 'cleared', by: 'clinician' });
		expect(limits.categories.impact.source).toContain('Ines Varga');
		expect(limits.newFindings).toEqual([]);
		expect(limits.reviewOverdue).toBe(false);
	});

	it('ignores a screening the same day recorded before the clearance, not one recorded after', () => {
		// Sperstad JB et al. 2016 — 2 finger widths or more; the hold it puts back: common practice
		const c = clearance({ setAt });
		const wide = { sites: { at_navel: measure(2), below_navel: measure(2.5) } };
		const before = screening({
			takenAt: '2026-07-10T09:00:00Z',
			recordedAt: '2026-07-10T11:59:00Z',
			...wide
		});
		const unchanged = effectiveLimits(postpartum(), [known, before], c, today);
		expect(unchanged.newFindings).toEqual([]);
		expect(held(unchanged)).toEqual([]);

		const after = screening({
			takenAt: '2026-07-10T09:00:00Z',
			recordedAt: '2026-07-10T12:01:00Z',
			...wide
		});
		const limits = effectiveLimits(postpartum(), [known, after], c, today);
		// 1 → 2.5 finger widths below the navel: newly at the threshold, and widened by more than half
		expect(
			limits.newFindings.map((finding) => [finding.kind, finding.site, finding.screeningId])
		).toEqual([
			['newly_at_threshold', 'below_navel', after.id],
			['widened', 'below_navel', after.id]
		]);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
		expect(limits.categories.loaded_flexion).toMatchObject({ by: 'screening' });
		expect(limits.categories.loaded_flexion.reason).toMatch(/^New since the clearance/);
		expect(limits.categories.front_loaded).toMatchObject({ level: 'cleared', by: 'clinician' });
	});

	it('keeps the clearance when a known 2-finger gap is re-screened, not when a site widens by 1', () => {
		// trade practice, no source — a change of at most half a finger width is the test's own step
		const c = clearance({ setAt });
		const rescreened = screening({
			takenAt: '2026-07-15T10:00:00Z',
			sites: { at_navel: measure(2.5), above_navel: measure(1.5) }
		});
		const same = effectiveLimits(postpartum(), [known, rescreened], c, today);
		expect(same.newFindings).toEqual([]);
		expect(held(same)).toEqual([]);

		const widened = screening({
			takenAt: '2026-07-15T10:00:00Z',
			sites: { at_navel: measure(3), above_navel: measure(1.5) }
		});
		const limits = effectiveLimits(postpartum(), [known, widened], c, today);
		expect(limits.newFindings.map((finding) => [finding.kind, finding.site])).toEqual([
			['widened', 'at_navel']
		]);
		expect(limits.newFindings[0]?.holds).toEqual(['loaded_flexion', 'long_lever']);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
	});

	it('counts a site newly deep, soft or doming', () => {
		// common practice, informed by Lee & Hodges 2016 (deep / soft); common practice (doming)
		const c = clearance({ setAt });
		for (const [site, kind] of [
			[measure(1.5, { depth: 'deep' }), 'newly_deep'],
			[measure(1.5, { tension: 'soft' }), 'newly_soft'],
			[measure(1.5, { doming: true }), 'newly_doming']
		] as const) {
			const later = screening({
				takenAt: '2026-07-15T10:00:00Z',
				sites: { at_navel: measure(2), above_navel: site }
			});
			const limits = effectiveLimits(postpartum(), [known, later], c, today);
			expect(limits.newFindings.map((finding) => finding.kind)).toEqual([kind]);
			expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
		}
	});

	it('puts back the pelvic-floor holds for new leakage, and keeps the clinician’s own hold hers', () => {
		// common practice, in line with Goom T et al. 2019
		const c = clearance({
			setAt,
			levels: { impact: 'hold' } as Record<MovementCategory, ClearanceLevel>
		});
		const later = screening({
			takenAt: '2026-07-15T10:00:00Z',
			sites: known.sites,
			redFlags: ['leakage']
		});
		const limits = effectiveLimits(postpartum(), [known, later], c, today);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever', 'high_pressure', 'impact']);
		expect(limits.categories.impact.by).toBe('clinician');
		expect(limits.categories.high_pressure.by).toBe('screening');
		expect(limits.newFindings).toEqual([
			expect.objectContaining({ kind: 'red_flag', flag: 'leakage' })
		]);
	});

	it('lets a medical sign recorded after the clearance win over every level', () => {
		// NICE CG37 table 5-1; from memory (ACOG CO 804, 2020) for the pregnancy signs
		const c = clearance({ setAt });
		const later = screening({
			takenAt: '2026-07-15T10:00:00Z',
			sites: known.sites,
			redFlags: ['late_bleeding']
		});
		const limits = effectiveLimits(postpartum(), [known, later], c, today);
		expect(held(limits)).toEqual([...MOVEMENT_CATEGORIES]);
		expect(limits.seeDoctorFirst).toBe(true);
		expect(limits.categories.deep_stability.seeDoctorFirst).toBe(true);
		expect(limits.provisional).toBe(false);
	});

	it('lets a pregnancy clearance lapse at the birth: the postpartum rules apply', () => {
		// UK CMO 2019 via NHS pages (secondary) — under 6 weeks everything but deep stabilisation
		const c = clearance({ setAt: new Date('2026-03-01T12:00:00Z'), stageAtSet: 'pregnant' });
		const limits = effectiveLimits(postpartum(), [], c, addDays(BIRTH, 20));
		expect(limits.clearanceLapsed).toBe(true);
		expect(limits.provisional).toBe(true);
		expect(held(limits)).toEqual(ALL_BUT_DEEP);
		expect(limits.categories.deep_stability.level).toBe('no_limit');
		expect(limits.prompts.join(' ')).toContain('lapsed at the birth');

		// the same clearance while she is still pregnant stands
		const before = effectiveLimits(pregnant(), [], c, '2026-03-20');
		expect(before.clearanceLapsed).toBe(false);
		expect(before.categories.impact).toMatchObject({ level: 'cleared', by: 'clinician' });
	});

	it('holds nothing new for a wider gap in pregnancy, but does for new doming', () => {
		// Mota P et al. 2015 — wide gap expected late in pregnancy; doming: common practice
		const c = clearance({ setAt, stageAtSet: 'pregnant' });
		const base = screening({ takenAt: '2026-07-01T10:00:00Z', stage: 'pregnant' });
		const wider = screening({
			takenAt: '2026-07-15T10:00:00Z',
			stage: 'pregnant',
			sites: { at_navel: measure(3) }
		});
		const none = effectiveLimits(pregnant(), [base, wider], c, today);
		expect(none.newFindings).toEqual([]);
		expect(held(none)).toEqual([]);

		const doming = screening({
			takenAt: '2026-07-15T10:00:00Z',
			stage: 'pregnant',
			sites: { at_navel: measure(1, { doming: true }) }
		});
		const limits = effectiveLimits(pregnant(), [base, doming], c, today);
		expect(limits.newFindings.map((finding) => finding.kind)).toEqual(['newly_doming']);
		expect(held(limits)).toEqual(['loaded_flexion', 'long_lever']);
	});

	it('stays in force past its review date, overdue from the day after', () => {
		// common practice, no source: an overdue clearance is the safest information the studio has
		const c = clearance({ setAt, reviewOn: '2026-08-01' });
		const onTheDay = effectiveLimits(postpartum(), [known], c, '2026-08-01');
		expect(onTheDay.reviewOverdue).toBe(false);
		const dayAfter = effectiveLimits(postpartum(), [known], c, '2026-08-02');
		expect(dayAfter.reviewOverdue).toBe(true);
		expect(dayAfter.categories.impact).toMatchObject({ level: 'cleared', by: 'clinician' });
		expect(dayAfter.provisional).toBe(false);
	});

	it('names the date sharing ended on the clearance it keeps', () => {
		// GDPR Art. 17(3)(b) — clinical records are kept; the studio keeps the last clearance
		const c = clearance({ setAt, sharingEndedOn: '2026-07-18' });
		const limits = effectiveLimits(postpartum(), [known], c, today);
		expect(limits.categories.impact.level).toBe('cleared');
		expect(limits.categories.impact.source).toContain('sharing ended on 2026-07-18');
	});

	it('counts every finding as new when the clinic had no screening', () => {
		// Sperstad JB et al. 2016 — 2 finger widths or more
		const c = clearance({ setAt });
		const later = screening({ takenAt: '2026-07-15T10:00:00Z', sites: { at_navel: measure(2) } });
		const limits = effectiveLimits(postpartum(), [later], c, today);
		expect(limits.newFindings.map((finding) => finding.kind)).toEqual(['newly_at_threshold']);
	});
});

describe('effectiveLimits — input', () => {
	it('refuses a day that is not YYYY-MM-DD', () => {
		expect(() => effectiveLimits(postpartum(), [], null, '20 July')).toThrow(RangeError);
		expect(() => effectiveLimits(postpartum(), [], null, '2026-13-01')).toThrow(RangeError);
	});

	it('never reports cleared without a clinician', () => {
		// issue rule, common practice: no_limit is never shown as cleared
		const cases: EffectiveLimits[] = [
			effectiveLimits(postpartum(), [], null, addDays(BIRTH, 10)),
			effectiveLimits(postpartum(), [], null, addDays(BIRTH, 200)),
			effectiveLimits(pregnant(), [], null, '2026-06-01')
		];
		for (const limits of cases) {
			for (const category of MOVEMENT_CATEGORIES) {
				expect(limits.categories[category].level).not.toBe('cleared');
				expect(limits.categories[category].by).not.toBe('clinician');
			}
		}
	});
});
