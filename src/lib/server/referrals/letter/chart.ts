import { scaleLinear, scaleTime } from 'd3-scale';
import { line } from 'd3-shape';
import { rgb, LineCapStyle, type PDFPage, type RGB } from 'pdf-lib';
import { chartSeries, SITES, siteLabelCapitalised, type ChartPoint } from '$lib/domain';
import {
	COLOURS,
	CONTENT_WIDTH,
	LetterWriter,
	MARGIN_X,
	MONTHS,
	type Marker,
	type ReferralLetterInput,
	SITE_STYLE,
	THRESHOLD_FINGERS,
	dateParts,
	dotted
} from './page';

function markerPath(marker: Marker, size: number): string | null {
	if (marker !== 'triangle') return null;
	const r = size * 1.25;
	return `M 0 ${-r} L ${r * 0.9} ${r * 0.6} L ${-r * 0.9} ${r * 0.6} Z`;
}

function drawMarker(page: PDFPage, marker: Marker, x: number, y: number, colour: RGB): void {
	const size = 3;
	if (marker === 'circle') {
		page.drawCircle({
			x,
			y,
			size: size * 0.8,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	} else if (marker === 'square') {
		const side = size * 1.5;
		page.drawRectangle({
			x: x - side / 2,
			y: y - side / 2,
			width: side,
			height: side,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	} else {
		// drawSvgPath places the path's origin at (x, y) and flips its y axis (SVG y points down).
		page.drawSvgPath(markerPath(marker, size) ?? '', {
			x,
			y,
			color: colour,
			borderColor: rgb(1, 1, 1),
			borderWidth: 0.6
		});
	}
}

function formatTick(date: Date, spanDays: number, tz: string): string {
	const { day, month, year } = dateParts(date, tz);
	return spanDays > 300 ? `${MONTHS[month]} ${year}` : `${day} ${MONTHS[month]}`;
}

const DAY_MS = 86_400_000;

/**
 * Width per site over time. d3 scales give positions inside the plot in SVG orientation (origin
 * top left, y down); d3-shape turns each series into an SVG path, and pdf-lib's drawSvgPath puts
 * that path's origin at the plot's top-left corner and flips y, so the same numbers serve both
 * the paths and the markers (at plotTop − y).
 */
export function drawChart(w: LetterWriter, input: ReferralLetterInput, tz: string): void {
	const series = chartSeries(
		input.screenings.map((screening) => ({ takenAt: screening.takenAt, sites: screening.sites }))
	);
	const points = SITES.flatMap((site) => series[site]);
	if (points.length === 0) return;

	const legendHeight = 30;
	const plotHeight = 150;
	const axisHeight = 22;
	const total = legendHeight + plotHeight + axisHeight + 12;
	w.ensure(total);

	const left = MARGIN_X + 30;
	const plotWidth = CONTENT_WIDTH - 30;
	const legendTop = w.y - 6;
	const plotTop = legendTop - legendHeight;
	const page = w.page;

	const times = points.map((point) => new Date(point.t).getTime());
	let [start, end] = [Math.min(...times), Math.max(...times)];
	if (end - start < DAY_MS) {
		start -= 7 * DAY_MS;
		end += 7 * DAY_MS;
	}
	const x = scaleTime()
		.domain([new Date(start), new Date(end)])
		.range([10, plotWidth - 10]);
	const maxWidth = Math.max(...points.map((point) => point.fingers));
	const yMax = Math.min(6, Math.max(3, Math.ceil(maxWidth + 0.5)));
	const y = scaleLinear().domain([0, yMax]).range([plotHeight, 0]);

	// Grid and y axis, one line per finger width.
	for (let value = 0; value <= yMax; value++) {
		const py = plotTop - y(value);
		page.drawLine({
			start: { x: left, y: py },
			end: { x: left + plotWidth, y: py },
			thickness: value === 0 ? 0.8 : 0.5,
			color: value === 0 ? COLOURS.threshold : COLOURS.grid
		});
		const label = String(value);
		w.text(label, left - 6 - w.width(label, { size: 8 }), py - 2.8, {
			size: 8,
			colour: COLOURS.inkFaint
		});
	}
	w.text('finger widths', MARGIN_X, plotTop + 8, { size: 7.5, colour: COLOURS.inkFaint });

	// The 2-finger-width line: the common threshold for referring after the birth.
	const thresholdY = plotTop - y(THRESHOLD_FINGERS);
	page.drawLine({
		start: { x: left, y: thresholdY },
		end: { x: left + plotWidth, y: thresholdY },
		thickness: 0.9,
		color: COLOURS.threshold,
		dashArray: [4, 3]
	});

	// X axis ticks.
	const spanDays = (end - start) / DAY_MS;
	const ticks = x.ticks(Math.max(2, Math.min(6, Math.round(plotWidth / 80))));
	for (const tick of ticks) {
		const px = left + x(tick);
		page.drawLine({
			start: { x: px, y: plotTop - plotHeight },
			end: { x: px, y: plotTop - plotHeight - 3 },
			thickness: 0.6,
			color: COLOURS.threshold
		});
		const label = formatTick(tick, spanDays, tz);
		w.text(label, px - w.width(label, { size: 8 }) / 2, plotTop - plotHeight - 13, {
			size: 8,
			colour: COLOURS.inkFaint
		});
	}

	const path = line<ChartPoint>()
		.x((point) => x(new Date(point.t)))
		.y((point) => y(point.fingers));
	for (const site of SITES) {
		const style = SITE_STYLE[site];
		const data = series[site];
		const d = data.length > 1 ? path(data) : null;
		if (d) {
			page.drawSvgPath(d, {
				x: left,
				y: plotTop,
				borderColor: style.colour,
				borderWidth: 1.6,
				borderDashArray: style.dash,
				borderLineCap: dotted(style.dash) ? LineCapStyle.Round : LineCapStyle.Butt
			});
		}
		for (const point of data) {
			drawMarker(
				page,
				style.marker,
				left + x(new Date(point.t)),
				plotTop - y(point.fingers),
				style.colour
			);
		}
	}

	// Legend: a sample of each line with its marker, then the threshold line.
	let lx = left;
	const ly = legendTop - 12;
	for (const site of SITES) {
		const style = SITE_STYLE[site];
		page.drawLine({
			start: { x: lx, y: ly + 3 },
			end: { x: lx + 24, y: ly + 3 },
			thickness: 1.6,
			color: style.colour,
			dashArray: style.dash.length > 0 ? style.dash : undefined,
			lineCap: dotted(style.dash) ? LineCapStyle.Round : undefined
		});
		drawMarker(page, style.marker, lx + 12, ly + 3, style.colour);
		const label = siteLabelCapitalised(site);
		w.text(label, lx + 30, ly, { size: 8.5 });
		lx += 30 + w.width(label, { size: 8.5 }) + 16;
	}
	page.drawLine({
		start: { x: lx, y: ly + 3 },
		end: { x: lx + 24, y: ly + 3 },
		thickness: 0.9,
		color: COLOURS.threshold,
		dashArray: [4, 3]
	});
	w.text('2 finger widths', lx + 30, ly, { size: 8.5, colour: COLOURS.inkSoft });

	w.y = plotTop - plotHeight - axisHeight - 6;
}
