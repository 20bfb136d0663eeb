import { describe, expect, it } from 'vitest';
import { earlyScreenWarnings } from './stage';

describe('earlyScreenWarnings', () => {
	it('warns before 6 weeks after the birth', () => {
		// UK CMO 2019 via NHS pages (secondary) — the postnatal check at about 6–8 weeks comes first
		const warnings = earlyScreenWarnings({ stage: 'postpartum', weeksPostpartum: 4 });
		expect(warnings.map((warning) => warning.code)).toEqual(['before_six_weeks']);
		expect(warnings[0]?.message).toContain('4 weeks');
		expect(warnings[0]?.source).toContain('Sperstad');
	});

	it('does not warn at exactly 6 weeks, and does at 5', () => {
		// UK CMO 2019 via NHS pages (secondary) — about 6 weeks; the 6-week cut is common practice
		expect(earlyScreenWarnings({ stage: 'postpartum', weeksPostpartum: 6 })).toEqual([]);
		expect(earlyScreenWarnings({ stage: 'postpartum', weeksPostpartum: 5 })).toHaveLength(1);
	});

	it('uses the singular for one week', () => {
		const [warning] = earlyScreenWarnings({ stage: 'postpartum', weeksPostpartum: 1 });
		expect(warning?.message).toContain('1 week after');
	});

	it('warns when the postnatal check has not happened, whatever the weeks', () => {
		// UK CMO 2019 via NHS pages (secondary) — the postnatal check comes before building intensity
		const warnings = earlyScreenWarnings({
			stage: 'postpartum',
			weeksPostpartum: 9,
			postnatalCheckDone: false
		});
		expect(warnings.map((warning) => warning.code)).toEqual(['postnatal_check_pending']);
		expect(
			earlyScreenWarnings({ stage: 'postpartum', weeksPostpartum: 9, postnatalCheckDone: true })
		).toEqual([]);
	});

	it('gives both warnings when early and before the check', () => {
		const warnings = earlyScreenWarnings({
			stage: 'postpartum',
			weeksPostpartum: 3,
			postnatalCheckDone: false
		});
		expect(warnings.map((warning) => warning.code)).toEqual([
			'before_six_weeks',
			'postnatal_check_pending'
		]);
	});

	it('says when the weeks since the birth are unknown', () => {
		expect(earlyScreenWarnings({ stage: 'postpartum' }).map((warning) => warning.code)).toEqual([
			'weeks_postpartum_unknown'
		]);
	});

	it('has nothing to say in pregnancy', () => {
		expect(earlyScreenWarnings({ stage: 'pregnant', weeksOfGestation: 20 })).toEqual([]);
	});
});
