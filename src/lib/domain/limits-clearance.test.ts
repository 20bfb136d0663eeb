import { describe, expect, it } from 'vitest';
import { effectiveLimits } from './limits';
import {
	MOVEMENT_CATEGORIES,
	type ClearanceLevel,
	type EffectiveLimits,
	type MovementCategory
} from './movement';
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

// Movement limits once a physiotherapist has set a clearance, and the input checks.

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
