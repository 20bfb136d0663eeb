import { describe, expect, it } from 'vitest';
import { combinedChartGeometry, siteChartGeometry, yDomain } from './chart';

const size = { width: 300, height: 200 };

describe('siteChartGeometry', () => {
	it('keeps the 2-finger-width line in view with room either side, even with no points', () => {
		// Sperstad JB et al. 2016 — 2 finger widths is the threshold
		const chart = siteChartGeometry([], size);
		expect(chart.threshold.value).toBe(2);
		expect(chart.threshold.y).toBeGreaterThan(chart.plot.top);
		expect(chart.threshold.y).toBeLessThan(chart.plot.bottom);
		expect(chart.path).toBeNull();
	});

	it('fits the y-range to the data so a half-finger change shows, threshold always inside', () => {
		// common practice, no source — layout choice; the threshold is Sperstad 2016's 2 fingers
		expect(yDomain([{ t: '2025-01-01T00:00:00Z', fingers: 4.5 }])).toEqual([1, 5]);
		expect(yDomain([{ t: '2025-01-01T00:00:00Z', fingers: 0.5 }])).toEqual([0, 3]);
		expect(yDomain([{ t: '2025-01-01T00:00:00Z', fingers: 6 }])).toEqual([1, 6]);
		const narrow = siteChartGeometry(
			[
				{ t: '2025-01-01T10:00:00.000Z', fingers: 2 },
				{ t: '2025-02-01T10:00:00.000Z', fingers: 2.5 }
			],
			size
		);
		// Half a finger width is at least a tenth of the plot's height (on a 0–6 axis: a twelfth).
		const [a, b] = narrow.points;
		expect(a!.y - b!.y).toBeGreaterThan((narrow.plot.bottom - narrow.plot.top) / 10);
		expect(narrow.yTicks.map((t) => t.value)).toContain(2.5);
	});

	it('places points oldest left to newest right inside the plot, wider gaps higher', () => {
		// common practice, no source — plotting convention
		const chart = siteChartGeometry(
			[
				{ t: '2025-01-01T10:00:00.000Z', fingers: 3, outcome: 'refer' },
				{ t: '2025-02-01T10:00:00.000Z', fingers: 1.5, mm: 22, outcome: 'monitor' }
			],
			size
		);
		const [first, second] = chart.points;
		expect(first!.x).toBeGreaterThan(chart.plot.left);
		expect(second!.x).toBeLessThan(chart.plot.right - 4);
		expect(first!.x).toBeLessThan(second!.x);
		expect(first!.y).toBeLessThan(second!.y);
		expect(first!.outcome).toBe('refer');
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

describe('combinedChartGeometry', () => {
	it('draws the three sites on one shared scale', () => {
		// common practice, no source — one set of axes so the sites compare at a glance
		const at = (t: string, fingers: number) => ({ t, fingers });
		const chart = combinedChartGeometry({
			above_navel: [at('2025-01-01T10:00:00Z', 1), at('2025-02-01T10:00:00Z', 1)],
			at_navel: [at('2025-01-01T10:00:00Z', 3), at('2025-02-01T10:00:00Z', 2.5)],
			below_navel: []
		});
		expect(chart.lines.map((l) => l.site)).toEqual(['above_navel', 'at_navel', 'below_navel']);
		const [above, at_navel, below] = chart.lines;
		expect(above!.points[0]!.x).toBeCloseTo(at_navel!.points[0]!.x, 6);
		expect(at_navel!.points[0]!.y).toBeLessThan(above!.points[0]!.y);
		expect(below!.path).toBeNull();
	});
});
