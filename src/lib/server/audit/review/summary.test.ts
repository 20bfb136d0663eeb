import { describe, expect, it } from 'vitest';
import {
	kindOf,
	median,
	MIN_UNUSUAL_READS,
	summariseWeeks,
	summaryStart,
	weekOf,
	type DailyCount
} from './summary';

// Invented counts; the "three times the median of the four weeks before" rule is the
// product's own (common practice for a simple outlier flag, no source).

const day = (
	userId: string,
	d: string,
	count: number,
	action = 'client.read',
	outcome = 'success'
): DailyCount => ({
	userId,
	name: userId,
	day: d,
	action,
	outcome,
	count
});

describe('weekly activity summary', () => {
	it('weeks start on Monday (UTC)', () => {
		expect(weekOf('2026-12-02')).toBe('2026-11-30'); // a Wednesday
		expect(weekOf('2026-11-30')).toBe('2026-11-30');
		expect(weekOf('2026-12-06')).toBe('2026-11-30'); // Sunday
		expect(summaryStart('2026-12-02', 1)).toBe('2026-11-02');
	});

	it('sorts actions into kinds; any refused or failed attempt is a refusal', () => {
		expect(kindOf('client.read', 'success')).toBe('read');
		expect(kindOf('referral.listed', 'success')).toBe('read');
		expect(kindOf('document.downloaded', 'success')).toBe('download');
		expect(kindOf('audit.exported', 'success')).toBe('export');
		expect(kindOf('screening.recorded', 'success')).toBe('change');
		expect(kindOf('client.read', 'refused')).toBe('refusal');
	});

	it('median of an even count is the mean of the middle two', () => {
		expect(median([4, 1, 3, 2])).toBe(2.5);
		expect(median([5])).toBe(5);
		expect(median([])).toBe(0);
	});

	it('counts per member per week and flags reads above three times her four-week median', () => {
		const daily = [
			// Four earlier weeks of 10, 12, 8, 10 reads: median 10.
			day('ana', '2026-11-02', 10),
			day('ana', '2026-11-09', 12),
			day('ana', '2026-11-16', 8),
			day('ana', '2026-11-23', 10),
			// This week: 31 reads over two days (> 30), a download and a refusal.
			day('ana', '2026-11-30', 20),
			day('ana', '2026-12-01', 11),
			day('ana', '2026-12-01', 1, 'document.downloaded'),
			day('ana', '2026-12-02', 2, 'client.read', 'refused'),
			// Ben: steady, exactly three times is not "more than".
			day('ben', '2026-11-09', 5),
			day('ben', '2026-11-16', 5),
			day('ben', '2026-11-23', 5),
			day('ben', '2026-11-02', 5),
			day('ben', '2026-12-02', 15)
		];
		const [ana, ben] = summariseWeeks(daily, '2026-12-02', 2);
		expect(ana!.userId).toBe('ana');
		expect(ana!.weeks[0]).toEqual({
			week: '2026-11-30',
			counts: { read: 31, download: 1, export: 0, change: 0, refusal: 2 },
			baselineReads: 10,
			unusual: true
		});
		// The week before: median of 12, 8, 10 and an empty week (0) = 9; 10 reads is usual.
		expect(ana!.weeks[1]).toMatchObject({ week: '2026-11-23', baselineReads: 9, unusual: false });
		expect(ben!.weeks[0]).toMatchObject({ baselineReads: 5, unusual: false });
	});

	it('never flags a handful of reads, even against an empty history', () => {
		// A new member's first week: a median of 0 would make any read "unusual".
		const [few] = summariseWeeks([day('di', '2026-12-01', MIN_UNUSUAL_READS - 1)], '2026-12-02', 1);
		expect(few!.weeks[0]).toMatchObject({ baselineReads: 0, unusual: false });
		const [many] = summariseWeeks([day('di', '2026-12-01', MIN_UNUSUAL_READS)], '2026-12-02', 1);
		expect(many!.weeks[0]).toMatchObject({ baselineReads: 0, unusual: true });
	});

	it('leaves out members with nothing in the weeks shown', () => {
		expect(summariseWeeks([day('cy', '2026-10-01', 3)], '2026-12-02', 2)).toEqual([]);
	});
});
