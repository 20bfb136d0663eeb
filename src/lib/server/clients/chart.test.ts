import { describe, expect, it } from 'vitest';
import { siteChartGeometry } from './chart';

const size = { width: 320, height: 180 };

describe('siteChartGeometry', () => {
	it('draws the 2-finger-width line a third of the way up a 0–6 axis', () => {
		// Sperstad JB et al. 2016 — 2 finger widths is the threshold; the axis spans the test's 0–6
		const chart = siteChartGeometry([], size);
		const { top, bottom } = chart.plot;
		expect(chart.threshold.value).toBe(2);
		expect(chart.threshold.y).toBeCloseTo(bottom - ((bottom - top) * 2) / 6, 6);
		expect(chart.path).toBeNull();
		expect(chart.yTicks.map((t) => t.value)).toEqual([0, 1, 2, 3, 4, 5, 6]);
	});

	it('places points oldest left to newest right, wider gaps higher', () => {
		// common practice, no source — plotting convention
		const chart = siteChartGeometry(
			[
				{ t: '2025-01-01T10:00:00.000Z', fingers: 3 },
				{ t: '2025-02-01T10:00:00.000Z', fingers: 1.5, mm: 22 }
			],
			size
		);
		const [first, second] = chart.points;
		expect(first!.x).toBeCloseTo(chart.plot.left, 6);
		expect(second!.x).toBeCloseTo(chart.plot.right, 6);
		expect(first!.y).toBeLessThan(second!.y);
		expect(chart.path).toMatch(/^M[\d.]+,[\d.]+L[\d.]+,[\d.]+$/);
		expect(second!.label).toBe('1 Feb 2025: 1.5 finger widths (22 mm)');
	});

	it('centres a single screening in a two-week window', () => {
		// common practice, no source — layout choice
		const chart = siteChartGeometry([{ t: '2025-03-10T12:00:00.000Z', fingers: 2 }], size);
		const middle = (chart.plot.left + chart.plot.right) / 2;
		expect(chart.points[0]!.x).toBeCloseTo(middle, 6);
		expect(chart.points[0]!.y).toBeCloseTo(chart.threshold.y, 6);
	});
});
