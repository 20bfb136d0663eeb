import type { Outcome } from './screening';
import type { Site } from './sites';
import { SOURCES } from './sources';

/**
 * A change of at most half a finger width, inclusive, is steady: it is the test's own step,
 * so a smaller change cannot be told from reading error (trade practice, no published source).
 */
export const STEADY_BAND = {
	value: 0.5,
	unit: 'finger_widths',
	inclusive: true,
	source: SOURCES.trendStepPractice
} as const;

/** Absorbs float noise such as 2.1 − 1.6 = 0.5000000000000002. */
const EPSILON = 1e-9;
const MS_PER_WEEK = 7 * 86_400_000;

export type TrendDirection = 'improving' | 'steady' | 'widening';

export interface TrendPoint {
	takenAt: Date | string;
	widthFingers: number;
}

/**
 * A change of more than the steady band between the two latest screenings. It is shown on its
 * own, beside the first-to-latest direction, so a recent jump is never hidden by a long, steady
 * history (trade practice: the test's own step, no published source).
 */
export interface TrendJump<P extends TrendPoint = TrendPoint> {
	direction: 'widened' | 'narrowed';
	/** Size of the change, in finger widths, always positive. */
	by: number;
	/** The screening the latest one is compared with. */
	since: P;
}

export interface SiteTrend<P extends TrendPoint = TrendPoint> {
	/** Null with fewer than two screenings. Narrowing is improving. */
	direction: TrendDirection | null;
	/** Latest minus first, in finger widths; negative is narrower. */
	changeSinceFirst: number | null;
	/** Latest minus the one before it. */
	changeSincePrevious: number | null;
	/** Change since the first per week between first and latest; null when no time passed. */
	changePerWeek: number | null;
	/** Set when the latest screening moved by more than half a finger width from the previous. */
	jump: TrendJump<P> | null;
	first: P | null;
	latest: P | null;
	count: number;
}

function timeOf(value: Date | string): number {
	const ms = (typeof value === 'string' ? new Date(value) : value).getTime();
	if (Number.isNaN(ms)) throw new RangeError(`Not a valid date: ${String(value)}`);
	return ms;
}

/** Rounds away float noise from finger-width arithmetic (half steps need no more). */
function clean(value: number): number {
	return Math.round(value * 1e6) / 1e6;
}

/** Oldest first; points taken at the same moment keep their given order. */
export function sortByTime<P extends { takenAt: Date | string }>(points: readonly P[]): P[] {
	return points
		.map((point) => ({ point, time: timeOf(point.takenAt) }))
		.sort((a, b) => a.time - b.time)
		.map(({ point }) => point);
}

function isBeyondSteadyBand(change: number): boolean {
	return Math.abs(change) > STEADY_BAND.value + EPSILON;
}

export function directionOf(changeSinceFirst: number): TrendDirection {
	if (!isBeyondSteadyBand(changeSinceFirst)) return 'steady';
	return changeSinceFirst < 0 ? 'improving' : 'widening';
}

/** The trend of one site, from the first screening to the latest, in any input order. */
export function siteTrend<P extends TrendPoint>(points: readonly P[]): SiteTrend<P> {
	const sorted = sortByTime(points);
	const first = sorted[0] ?? null;
	const latest = sorted.at(-1) ?? null;
	const previous = sorted.at(-2) ?? null;
	if (first === null || latest === null || previous === null) {
		return {
			direction: null,
			changeSinceFirst: null,
			changeSincePrevious: null,
			changePerWeek: null,
			jump: null,
			first,
			latest,
			count: sorted.length
		};
	}
	const changeSinceFirst = clean(latest.widthFingers - first.widthFingers);
	const changeSincePrevious = clean(latest.widthFingers - previous.widthFingers);
	const weeks = (timeOf(latest.takenAt) - timeOf(first.takenAt)) / MS_PER_WEEK;
	return {
		direction: directionOf(changeSinceFirst),
		changeSinceFirst,
		changeSincePrevious,
		changePerWeek: weeks > 0 ? changeSinceFirst / weeks : null,
		jump: isBeyondSteadyBand(changeSincePrevious)
			? {
					direction: changeSincePrevious > 0 ? 'widened' : 'narrowed',
					by: Math.abs(changeSincePrevious),
					since: previous
				}
			: null,
		first,
		latest,
		count: sorted.length
	};
}

/** What trends and charts need of a screening; sites not recorded are skipped. */
export interface ScreeningWidths {
	takenAt: Date | string;
	/** The screening's outcome, when known: charts mark each point by it. */
	outcome?: Outcome;
	sites: Partial<Record<Site, { widthFingers: number; widthMm?: number | null }>>;
}

export interface SiteTrendPoint extends TrendPoint {
	widthMm: number | null;
	outcome: Outcome | null;
}

function pointsForSite(screenings: readonly ScreeningWidths[], site: Site): SiteTrendPoint[] {
	return screenings.flatMap((screening) => {
		const measure = screening.sites[site];
		if (measure === undefined) return [];
		return [
			{
				takenAt: screening.takenAt,
				widthFingers: measure.widthFingers,
				widthMm: measure.widthMm ?? null,
				outcome: screening.outcome ?? null
			}
		];
	});
}

/** The trend of each of the three sites. */
export function screeningTrend(
	screenings: readonly ScreeningWidths[]
): Record<Site, SiteTrend<SiteTrendPoint>> {
	return {
		above_navel: siteTrend(pointsForSite(screenings, 'above_navel')),
		at_navel: siteTrend(pointsForSite(screenings, 'at_navel')),
		below_navel: siteTrend(pointsForSite(screenings, 'below_navel'))
	};
}

export interface ChartPoint {
	/** ISO 8601 timestamp. */
	t: string;
	fingers: number;
	/** Only where a width was measured in mm. */
	mm?: number;
	/** The screening's outcome, where known. */
	outcome?: Outcome;
}

function chartPointsForSite(screenings: readonly ScreeningWidths[], site: Site): ChartPoint[] {
	return sortByTime(pointsForSite(screenings, site)).map((point) => {
		const chartPoint: ChartPoint = {
			t: new Date(timeOf(point.takenAt)).toISOString(),
			fingers: point.widthFingers
		};
		if (point.widthMm !== null) chartPoint.mm = point.widthMm;
		if (point.outcome !== null) chartPoint.outcome = point.outcome;
		return chartPoint;
	});
}

/** Per site, the points to plot, oldest first. */
export function chartSeries(screenings: readonly ScreeningWidths[]): Record<Site, ChartPoint[]> {
	return {
		above_navel: chartPointsForSite(screenings, 'above_navel'),
		at_navel: chartPointsForSite(screenings, 'at_navel'),
		below_navel: chartPointsForSite(screenings, 'below_navel')
	};
}
