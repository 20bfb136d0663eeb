import { scaleLinear, scaleUtc } from 'd3-scale';
import { formatDate, formatDayMonth } from '$lib/dates';
import { line } from 'd3-shape';
import {
	FINGER_WIDTH_MAX,
	FINGER_WIDTH_MIN,
	formatFingerWidths,
	SITES,
	SPERSTAD_FINGER_WIDTH,
	type ChartPoint,
	type Site
} from '$lib/domain';
import type {
	ChartPointGeometry,
	ChartSize,
	CombinedChartGeometry,
	SiteChartGeometry
} from '$lib/clients/chart-types';

export type { ChartSize, CombinedChartGeometry, SiteChartGeometry };

// Geometry for the charts, computed on the server with d3's scales and line generator. The
// Svelte component only draws what this returns, so no chart code reaches the browser.
//
// The y-range fits the data (so a change of half a finger width is visible) but always keeps
// the 2-finger-width threshold in view with room either side; points sit inside the plot with a
// little padding, so the first and last are never clipped.

const MARGIN = { top: 12, right: 12, bottom: 30, left: 36 };
const INSET = 12;
const WEEK_MS = 7 * 86_400_000;
export const DEFAULT_CHART_SIZE: ChartSize = { width: 300, height: 200 };

export const formatDay = formatDate;
const formatTick = formatDayMonth;

/** The finger-width range to show: the data with half a finger either side, and the threshold. */
export function yDomain(points: readonly ChartPoint[]): [number, number] {
	const threshold = SPERSTAD_FINGER_WIDTH.value;
	if (points.length === 0) return [FINGER_WIDTH_MIN, threshold + 2];
	const values = points.map((p) => p.fingers);
	const low = Math.max(FINGER_WIDTH_MIN, Math.floor(Math.min(...values) - 0.5));
	const high = Math.min(FINGER_WIDTH_MAX, Math.ceil(Math.max(...values) + 0.5));
	return [Math.min(low, threshold - 1), Math.max(high, threshold + 1)];
}

function frame(points: readonly ChartPoint[], size: ChartSize) {
	const plot = {
		left: MARGIN.left,
		right: size.width - MARGIN.right,
		top: MARGIN.top,
		bottom: size.height - MARGIN.bottom
	};
	const times = points.map((p) => Date.parse(p.t));
	let start = times.length ? Math.min(...times) : Date.now() - 4 * WEEK_MS;
	let end = times.length ? Math.max(...times) : Date.now();
	// A single screening (or several on one day) sits in the middle of a two-week window.
	if (end - start < WEEK_MS) {
		const middle = (start + end) / 2;
		start = middle - WEEK_MS;
		end = middle + WEEK_MS;
	}
	const x = scaleUtc()
		.domain([new Date(start), new Date(end)])
		.range([plot.left + INSET, plot.right - INSET]);
	const [low, high] = yDomain(points);
	const y = scaleLinear().domain([low, high]).range([plot.bottom, plot.top]);
	const step = high - low <= 3 ? 0.5 : 1;
	const yTicks: Array<{ y: number; value: number }> = [];
	for (let value = low; value <= high + 1e-9; value += step) yTicks.push({ y: y(value), value });
	const threshold = SPERSTAD_FINGER_WIDTH.value;
	const place = (p: ChartPoint): ChartPointGeometry => ({
		x: x(new Date(p.t)),
		y: y(p.fingers),
		t: p.t,
		fingers: p.fingers,
		mm: p.mm ?? null,
		outcome: p.outcome ?? null,
		label: `${formatDay(p.t)}: ${formatFingerWidths(p.fingers)}${p.mm === undefined ? '' : ` (${p.mm} mm)`}`
	});
	const pathOf = (placed: ChartPointGeometry[]) =>
		placed.length > 0
			? line<ChartPointGeometry>()
					.x((p) => p.x)
					.y((p) => p.y)(placed)
			: null;
	return {
		base: {
			...size,
			plot,
			threshold: {
				y: y(threshold),
				value: threshold,
				label: `${formatFingerWidths(threshold)}: refer after the birth`
			},
			yTicks,
			xTicks: x.ticks(3).map((t) => ({ x: x(t), label: formatTick(t) }))
		},
		place,
		pathOf
	};
}

/** One site's points over time. */
export function siteChartGeometry(
	points: readonly ChartPoint[],
	size: ChartSize = DEFAULT_CHART_SIZE
): SiteChartGeometry {
	const { base, place, pathOf } = frame(points, size);
	const placed = points.map(place);
	return { ...base, path: pathOf(placed), points: placed };
}

/** The three sites on one set of axes, so they compare at a glance. */
export function combinedChartGeometry(
	series: Record<Site, readonly ChartPoint[]>,
	size: ChartSize = { width: 600, height: 240 }
): CombinedChartGeometry {
	const { base, place, pathOf } = frame(
		SITES.flatMap((site) => series[site]),
		size
	);
	return {
		...base,
		lines: SITES.map((site) => {
			const placed = series[site].map(place);
			return { site, path: pathOf(placed), points: placed };
		})
	};
}
