import { scaleLinear, scaleUtc } from 'd3-scale';
import { formatDate, formatDayMonth } from '$lib/dates';
import { line } from 'd3-shape';
import {
	FINGER_WIDTH_MAX,
	FINGER_WIDTH_MIN,
	formatFingerWidths,
	SPERSTAD_FINGER_WIDTH,
	type ChartPoint
} from '$lib/domain';
import type { ChartSize, SiteChartGeometry } from '$lib/clients/chart-types';

export type { ChartSize, SiteChartGeometry };

// Geometry for one site's chart, computed on the server with d3's scales and line generator.
// The Svelte component only draws what this returns, so no chart code reaches the browser,
// and a PDF writer can draw the same shapes later.

const MARGIN = { top: 12, right: 16, bottom: 28, left: 36 };
const WEEK_MS = 7 * 86_400_000;

export const formatDay = formatDate;
const formatTick = formatDayMonth;

/** Finger widths from 0 to 6 on a fixed axis, so the three sites' charts compare at a glance. */
export function siteChartGeometry(
	points: readonly ChartPoint[],
	size: ChartSize = { width: 320, height: 180 }
): SiteChartGeometry {
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
		.range([plot.left, plot.right]);
	const y = scaleLinear()
		.domain([FINGER_WIDTH_MIN, FINGER_WIDTH_MAX])
		.range([plot.bottom, plot.top]);

	const placed = points.map((p) => ({
		x: x(new Date(p.t)),
		y: y(p.fingers),
		t: p.t,
		fingers: p.fingers,
		mm: p.mm ?? null,
		label: `${formatDay(p.t)}: ${formatFingerWidths(p.fingers)}${p.mm === undefined ? '' : ` (${p.mm} mm)`}`
	}));
	const path =
		placed.length > 0
			? line<(typeof placed)[number]>()
					.x((p) => p.x)
					.y((p) => p.y)(placed)
			: null;
	const threshold = SPERSTAD_FINGER_WIDTH.value;
	return {
		...size,
		plot,
		path,
		points: placed,
		threshold: {
			y: y(threshold),
			value: threshold,
			label: `${formatFingerWidths(threshold)}: refer after the birth`
		},
		yTicks: y.ticks(FINGER_WIDTH_MAX).map((value) => ({ y: y(value), value })),
		xTicks: x.ticks(4).map((t) => ({ x: x(t), label: formatTick(t) }))
	};
}
