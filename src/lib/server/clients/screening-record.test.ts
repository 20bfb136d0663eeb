import { describe, expect, it } from 'vitest';
import type { SiteMeasure } from '../../domain';
import {
	assertNotBeforeConsent,
	buildScreeningRecord,
	SCREENING_RULES_VERSION,
	stageContextAt,
	ScreeningDateError
} from './screening-record';

const m = (widthFingers: number): SiteMeasure => ({
	widthFingers,
	depth: 'shallow',
	tension: 'firm',
	doming: false
});
const sites = { above_navel: m(1), at_navel: m(2.5), below_navel: m(1) };

describe('stageContextAt', () => {
	const postpartum = {
		stage: 'postpartum' as const,
		dueDate: null,
		birthDate: '2025-01-01',
		postnatalCheckOn: '2025-02-12'
	};

	it('computes weeks postpartum on the screening day and whether the check had happened', () => {
		// common practice, no source — completed weeks since the birth
		expect(stageContextAt(postpartum, new Date('2025-02-05T09:00:00Z'))).toEqual({
			stage: 'postpartum',
			weeksPostpartum: 5,
			postnatalCheckDone: false
		});
		expect(stageContextAt(postpartum, new Date('2025-02-12T09:00:00Z'))).toEqual({
			stage: 'postpartum',
			weeksPostpartum: 6,
			postnatalCheckDone: true
		});
	});

	it('reads a screening before the birth as pregnancy', () => {
		expect(stageContextAt(postpartum, new Date('2024-12-20T09:00:00Z'))).toEqual({
			stage: 'pregnant'
		});
	});

	it('computes weeks of gestation from the due date (40 weeks at the due date)', () => {
		// common practice, no source — obstetric convention: due date at 40 + 0 weeks
		const pregnant = {
			stage: 'pregnant' as const,
			dueDate: '2025-06-01',
			birthDate: null,
			postnatalCheckOn: null
		};
		expect(stageContextAt(pregnant, new Date('2025-03-09T12:00:00Z'))).toEqual({
			stage: 'pregnant',
			weeksOfGestation: 28
		});
		expect(() => stageContextAt(pregnant, new Date('2024-08-01T12:00:00Z'))).toThrow(
			ScreeningDateError
		);
	});
});

describe('buildScreeningRecord', () => {
	it('stores the outcome, reasons, weeks, warnings and rules version of the day', () => {
		// Sperstad JB et al. 2016 — ≥ 2 finger widths refers after the birth;
		// UK CMO 2019 via NHS pages (secondary) — a screen before 6 weeks carries a warning
		const record = buildScreeningRecord(
			{ stage: 'postpartum', dueDate: null, birthDate: '2025-01-01', postnatalCheckOn: null },
			{ takenAt: new Date('2025-02-01T10:00:00Z'), sites, redFlags: [] }
		);
		expect(record.outcome).toBe('refer');
		expect(record.reasons[0]).toMatchObject({
			code: 'width_at_or_over_threshold',
			site: 'at_navel'
		});
		expect(record.weeksPostpartum).toBe(4);
		expect(record.weeksOfGestation).toBeNull();
		expect(record.warnings.map((w) => w.code).sort()).toEqual(
			['before_six_weeks', 'postnatal_check_pending'].sort()
		);
		expect(record.sites.at_navel.widthMm).toBeNull();
		expect(record.rulesVersion).toBe(SCREENING_RULES_VERSION);
	});

	it('monitors the same gap in pregnancy', () => {
		// Mota P et al. 2015 — separation expected late in pregnancy: width alone monitors
		const record = buildScreeningRecord(
			{ stage: 'pregnant', dueDate: '2025-06-01', birthDate: null, postnatalCheckOn: null },
			{ takenAt: new Date('2025-03-09T10:00:00Z'), sites, redFlags: [] }
		);
		expect(record.outcome).toBe('monitor');
		expect(record.stage).toBe('pregnant');
		expect(record.weeksOfGestation).toBe(28);
		expect(record.warnings).toEqual([]);
	});
});

describe('assertNotBeforeConsent', () => {
	const consent = new Date('2025-03-10T15:00:00Z');

	it('allows the consent day itself, whatever the hour, and any later day', () => {
		// common practice, no source — screenings are recorded only once she has agreed
		expect(() => assertNotBeforeConsent(new Date('2025-03-10T08:00:00Z'), consent)).not.toThrow();
		expect(() => assertNotBeforeConsent(new Date('2025-03-11T00:00:00Z'), consent)).not.toThrow();
	});

	it('refuses the day before, naming the consent date', () => {
		expect(() => assertNotBeforeConsent(new Date('2025-03-09T23:59:59Z'), consent)).toThrow(
			new ScreeningDateError('must not be before her intake consent on 10 Mar 2025')
		);
	});
});
