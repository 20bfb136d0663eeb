import { describe, expect, it } from 'vitest';
import { daysUntilDue, erasureDueOn, isErasureOverdue } from './erasure';

// Source for the month rule: Regulation (EEC, Euratom) No 1182/71 (periods, dates and time
// limits), Art. 3(2)(c) — a period in months ends on the same date of the later month, or on
// its last day when that date does not exist; the EDPB Guidelines 01/2022 on the right of
// access (2023) apply it to Art. 12(3) with the example "received 5 March, answer by
// 5 April" (from memory, the example's dates).
describe('erasureDueOn', () => {
	it('is the same day of the next month', () => {
		expect(erasureDueOn(new Date('2023-03-05T10:00:00Z'))).toBe('2023-04-05');
	});

	it('ends on the last day of a shorter month', () => {
		expect(erasureDueOn(new Date('2026-01-31T08:00:00Z'))).toBe('2026-02-28');
		expect(erasureDueOn(new Date('2028-01-31T08:00:00Z'))).toBe('2028-02-29'); // leap year
		expect(erasureDueOn(new Date('2026-03-31T08:00:00Z'))).toBe('2026-04-30');
	});

	it('crosses the year', () => {
		expect(erasureDueOn(new Date('2026-12-15T23:59:00Z'))).toBe('2027-01-15');
	});
});

describe('isErasureOverdue and daysUntilDue', () => {
	it('is due on the day itself and overdue the day after', () => {
		expect(isErasureOverdue('2026-04-05', new Date('2026-04-05T23:00:00Z'))).toBe(false);
		expect(isErasureOverdue('2026-04-05', new Date('2026-04-06T00:00:00Z'))).toBe(true);
		expect(daysUntilDue('2026-04-05', new Date('2026-04-05T12:00:00Z'))).toBe(0);
		expect(daysUntilDue('2026-04-05', new Date('2026-03-05T12:00:00Z'))).toBe(31);
		expect(daysUntilDue('2026-04-05', new Date('2026-04-08T12:00:00Z'))).toBe(-3);
	});
});
