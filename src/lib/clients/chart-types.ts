// The shapes of a site chart, as the server computes them and the component draws them.

export interface ChartSize {
	width: number;
	height: number;
}

export interface SiteChartGeometry extends ChartSize {
	plot: { left: number; right: number; top: number; bottom: number };
	/** The SVG path through the points, oldest first; null with no points. */
	path: string | null;
	points: Array<{
		x: number;
		y: number;
		t: string;
		fingers: number;
		mm: number | null;
		label: string;
	}>;
	threshold: { y: number; value: number; label: string };
	yTicks: Array<{ y: number; value: number }>;
	xTicks: Array<{ x: number; label: string }>;
}
