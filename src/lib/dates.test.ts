import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import {
	formatClockSeconds,
	formatDate,
	formatDateLong,
	formatDayMonth,
	formatMoment,
	formatMomentSeconds,
	formatSession
} from './dates';

// en-GB day-month-year order with the month in words, and the 24-hour clock: common practice
// for British English (no source). Every value is read in UTC, so the day never moves.

describe('dates, as Seamwell shows them', () => {
	const moment = '2026-12-03T18:05:09Z';

	it('shows calendar days in UTC, whatever the time zone of the machine', () => {
		expect(formatDate('2026-12-03')).toBe('3 Dec 2026');
		expect(formatDateLong('2026-12-03')).toBe('3 December 2026');
		expect(formatDayMonth('2026-12-03')).toBe('3 Dec');
		// Just before midnight UTC is still that day.
		expect(formatDate('2026-12-03T23:59:00Z')).toBe('3 Dec 2026');
	});

	it('says moments in UTC and names the zone', () => {
		expect(formatMoment(moment)).toBe('3 Dec 2026, 18:05 UTC');
		expect(formatMomentSeconds(moment)).toBe('3 Dec 2026, 18:05:09 UTC');
		expect(formatClockSeconds(moment)).toBe('18:05:09 UTC');
		// 3 December 2026 is a Thursday (calendar fact).
		expect(formatSession(moment)).toBe('Thu 3 Dec, 18:05 UTC');
		expect(formatSession(moment, true)).toBe('Thursday 3 December, 18:05 UTC');
	});
});

function sources(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return sources(path);
		return /\.(ts|svelte)$/.test(name) && !/\.test\.ts$/.test(name) ? [path] : [];
	});
}

describe('one module formats dates', () => {
	it('no page or component formats a date itself', () => {
		const own = sources('src')
			.filter((path) => !path.endsWith('lib/dates.ts'))
			// The referral letter (a PDF) dates in the clinic's own zone, with its own month names.
			.filter((path) => !path.endsWith('referrals/letter/page.ts'))
			.filter((path) =>
				/toLocale(Date|Time)?String\(|new Intl\.DateTimeFormat/.test(readFileSync(path, 'utf8'))
			);
		expect(own).toEqual([]);
	});
});
