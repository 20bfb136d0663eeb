import { describe, expect, it } from 'vitest';
import type { SiteMeasure } from './sites';
import { chartSeries, screeningTrend, siteTrend, STEADY_BAND, type ScreeningWidths } from './trend';

function at(day: number): string {
	return new Date(Date.UTC(2025, 0, 1 + day)).toISOString();
}

function point(day: number, widthFingers: number) {
	return { takenAt: at(day), widthFingers };
}

describe('siteTrend — direction', () => {
	it('has no direction or changes with fewer than two screenings', () => {
		const none = siteTrend([]);
		expect(none).toMatchObject({ direction: null, changeSinceFirst: null, first: null, count: 0 });
		const one = siteTrend([point(0, 2)]);
		expect(one).toMatchObject({
			direction: null,
			changeSinceFirst: null,
			changeSincePrevious: null,
			changePerWeek: null,
			count: 1
		});
		expect(one.first).toEqual(point(0, 2));
		expect(one.latest).toEqual(point(0, 2));
	});

	it('calls a change of exactly half a finger width steady, either way', () => {
		// common practice, no source — at most half a finger width (inclusive) is steady
		expect(STEADY_BAND.value).toBe(0.5);
		expect(siteTrend([point(0, 2), point(14, 2.5)]).direction).toBe('steady');
		expect(siteTrend([point(0, 2.5), point(14, 2)]).direction).toBe('steady');
		expect(siteTrend([point(0, 2), point(14, 2)]).direction).toBe('steady');
	});

	it('calls narrowing by one finger width improving and widening by one widening', () => {
		// common practice, no source — beyond half a finger width is a change; narrower is better
		expect(siteTrend([point(0, 3), point(14, 2)])).toMatchObject({
			direction: 'improving',
			changeSinceFirst: -1
		});
		expect(siteTrend([point(0, 2), point(14, 3)])).toMatchObject({
			direction: 'widening',
			changeSinceFirst: 1
		});
	});

	it('is not tipped out of steady by float noise', () => {
		// common practice, no source — 0.5 inclusive; 2.1 − 1.6 is 0.5000000000000002 in floats
		const trend = siteTrend([point(0, 1.6), point(7, 2.1)]);
		expect(trend.direction).toBe('steady');
		expect(trend.changeSinceFirst).toBe(0.5);
	});

	it('goes by first and latest, not by the path between', () => {
		// DESIGN.md — direction from the first screening to the latest
		const trend = siteTrend([point(0, 3), point(7, 1), point(14, 3)]);
		expect(trend.direction).toBe('steady');
		expect(trend.changeSincePrevious).toBe(2);
	});
});

describe('siteTrend — a jump since the previous screening', () => {
	it('signals a widening of one finger width since the previous even when the whole trend is steady', () => {
		// common practice, no source — more than half a finger width (the test's step) is a change
		const trend = siteTrend([point(0, 2.5), point(7, 1), point(14, 2)]);
		expect(trend.direction).toBe('steady');
		expect(trend.changeSinceFirst).toBe(-0.5);
		expect(trend.jump).toEqual({ direction: 'widened', by: 1, since: point(7, 1) });
	});

	it('gives no jump for exactly half a finger width, and a narrowing jump beyond it', () => {
		// common practice, no source — at most half a finger width (inclusive) is steady
		expect(siteTrend([point(0, 2), point(7, 2.5)]).jump).toBeNull();
		expect(siteTrend([point(0, 1.6), point(7, 2.1)]).jump).toBeNull();
		expect(siteTrend([point(0, 3), point(7, 2)]).jump).toMatchObject({
			direction: 'narrowed',
			by: 1
		});
		expect(siteTrend([point(0, 3)]).jump).toBeNull();
	});
});

describe('siteTrend — order and rates', () => {
	it('sorts by time whatever the input order', () => {
		const trend = siteTrend([point(28, 2), point(0, 3), point(14, 2.5)]);
		expect(trend.first).toEqual(point(0, 3));
		expect(trend.latest).toEqual(point(28, 2));
		expect(trend.changeSinceFirst).toBe(-1);
		expect(trend.changeSincePrevious).toBe(-0.5);
	});

	it('accepts Date and string timestamps together', () => {
		const trend = siteTrend([
			{ takenAt: new Date(at(14)), widthFingers: 2 },
			{ takenAt: at(0), widthFingers: 3 }
		]);
		expect(trend.changeSinceFirst).toBe(-1);
	});

	it('gives the change per week between first and latest', () => {
		// 3 → 2 finger widths over 28 days = −1 over 4 weeks
		expect(siteTrend([point(0, 3), point(28, 2)]).changePerWeek).toBe(-0.25);
		// 2 → 3.5 over 21 days = +1.5 over 3 weeks
		expect(siteTrend([point(0, 2), point(21, 3.5)]).changePerWeek).toBe(0.5);
	});

	it('has no rate when no time passed between first and latest', () => {
		const trend = siteTrend([point(0, 2), point(0, 3)]);
		expect(trend.changePerWeek).toBeNull();
		expect(trend.changeSinceFirst).toBe(1);
	});

	it('refuses an invalid date', () => {
		expect(() => siteTrend([point(0, 2), { takenAt: 'not a date', widthFingers: 1 }])).toThrow(
			RangeError
		);
	});
});

function measure(widthFingers: number, widthMm?: number | null): SiteMeasure {
	return { widthFingers, widthMm, depth: 'shallow', tension: 'firm', doming: false };
}

const SCREENINGS: ScreeningWidths[] = [
	{
		takenAt: at(28),
		sites: { above_navel: measure(1), at_navel: measure(2, 31), below_navel: measure(1) }
	},
	{
		takenAt: at(0),
		sites: { above_navel: measure(2), at_navel: measure(3, null), below_navel: measure(1) }
	},
	{ takenAt: at(14), sites: { at_navel: measure(2.5, 38) } }
];

describe('screeningTrend', () => {
	it('gives each site its own trend and skips sites not recorded', () => {
		const trend = screeningTrend(SCREENINGS);
		expect(trend.above_navel).toMatchObject({
			direction: 'improving',
			changeSinceFirst: -1,
			count: 2
		});
		expect(trend.at_navel).toMatchObject({
			direction: 'improving',
			changeSinceFirst: -1,
			changeSincePrevious: -0.5,
			count: 3
		});
		expect(trend.below_navel).toMatchObject({ direction: 'steady', changeSinceFirst: 0 });
		expect(trend.at_navel.latest?.widthMm).toBe(31);
	});
});

describe('chartSeries', () => {
	it('gives each site its points oldest first, with ISO times', () => {
		const series = chartSeries(SCREENINGS);
		expect(series.at_navel).toEqual([
			{ t: '2025-01-01T00:00:00.000Z', fingers: 3 },
			{ t: '2025-01-15T00:00:00.000Z', fingers: 2.5, mm: 38 },
			{ t: '2025-01-29T00:00:00.000Z', fingers: 2, mm: 31 }
		]);
		expect(series.above_navel.map((p) => p.fingers)).toEqual([2, 1]);
		expect(series.below_navel).toHaveLength(2);
	});

	it('gives empty series with no screenings', () => {
		expect(chartSeries([])).toEqual({ above_navel: [], at_navel: [], below_navel: [] });
	});
});
