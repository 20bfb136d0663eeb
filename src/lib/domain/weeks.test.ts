import { describe, expect, it } from 'vitest';
import { weeksOfGestation, weeksPostpartum } from './weeks';

describe('weeksPostpartum', () => {
	it('counts completed weeks since the birth', () => {
		expect(weeksPostpartum('2025-01-01', '2025-01-01')).toBe(0);
		expect(weeksPostpartum('2025-01-01', '2025-02-11')).toBe(5); // 41 days
		expect(weeksPostpartum('2025-01-01', '2025-02-12')).toBe(6); // 42 days
	});

	it('counts calendar days, not hours', () => {
		const birth = new Date('2025-01-01T23:00:00Z');
		expect(weeksPostpartum(birth, new Date('2025-01-08T09:00:00Z'))).toBe(1);
	});

	it('counts across a leap day', () => {
		expect(weeksPostpartum('2024-02-22', '2024-03-07')).toBe(2); // 14 days with 29 Feb
	});

	it('refuses a date before the birth or an invalid date', () => {
		expect(() => weeksPostpartum('2025-01-08', '2025-01-01')).toThrow(RangeError);
		expect(() => weeksPostpartum('someday', '2025-01-01')).toThrow(RangeError);
	});
});

describe('weeksOfGestation', () => {
	it('is 40 weeks on the due date', () => {
		// common practice, no source — the due date is 40 weeks + 0 days
		expect(weeksOfGestation('2025-06-01', '2025-06-01')).toBe(40);
	});

	it('counts completed weeks before and after the due date', () => {
		// common practice, no source — 40 weeks at the due date
		expect(weeksOfGestation('2025-06-01', '2025-05-31')).toBe(39); // 39 + 6
		expect(weeksOfGestation('2025-06-01', '2025-03-23')).toBe(30); // 70 days before
		expect(weeksOfGestation('2025-06-01', '2025-06-08')).toBe(41); // 7 days past
	});

	it('refuses a date more than 40 weeks before the due date', () => {
		expect(weeksOfGestation('2025-06-01', '2024-08-25')).toBe(0); // 280 days before
		expect(() => weeksOfGestation('2025-06-01', '2024-08-24')).toThrow(RangeError);
	});
});
