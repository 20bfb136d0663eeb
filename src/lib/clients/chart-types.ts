import type { Outcome, Site } from '$lib/domain';

// The shapes of a site chart, as the server computes them and the component draws them.

export interface ChartSize {
	width: number;
	height: number;
}

export interface ChartPointGeometry {
	x: number;
	y: number;
	t: string;
	fingers: number;
	mm: number | null;
	/** The screening's outcome; the component draws a shape per outcome, not colour alone. */
	outcome: Outcome | null;
	label: string;
}

interface ChartFrame extends ChartSize {
	plot: { left: number; right: number; top: number; bottom: number };
	/** The threshold line; always inside the y-range, so it is always in view. */
	threshold: { y: number; value: number; label: string };
	yTicks: Array<{ y: number; value: number }>;
	xTicks: Array<{ x: number; label: string }>;
}

export interface SiteChartGeometry extends ChartFrame {
	/** The SVG path through the points, oldest first; null with no points. */
	path: string | null;
	points: ChartPointGeometry[];
}

/** The three sites on one set of axes, as the referral letter draws them. */
export interface CombinedChartGeometry extends ChartFrame {
	lines: Array<{ site: Site; path: string | null; points: ChartPointGeometry[] }>;
}
