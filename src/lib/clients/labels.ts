// Straight from each module, not the `$lib/domain` barrel: pages load this file, and the barrel
// would bring the criteria and sources tables into their JavaScript.
import { fingersToMm } from '$lib/domain/conversion';
import type { ReferTo } from '$lib/domain/red-flags';
import type { Outcome } from '$lib/domain/screening';
import type { TrendDirection } from '$lib/domain/trend';
import { formatDate } from '$lib/dates';

// Words the screens use for stored codes, in one place.

// In a module of its own: the outcome badge, on many pages, needs only these words.
export { OUTCOME_LABELS } from './outcome-labels';

/** The client's own view: what the outcome means for her, without jargon. */
export const OUTCOME_PLAIN: Record<Outcome, string> = {
	within_limit: 'The gap was within the usual limit at every place checked.',
	monitor: 'Your instructor will keep an eye on this at your next screenings.',
	refer: 'Your instructor suggests seeing a health professional about this.'
};

export const REFER_TO_LABELS: Record<ReferTo, string> = {
	physio: 'a pelvic-health physiotherapist',
	medical: 'a doctor'
};

export const DIRECTION_LABELS: Record<TrendDirection, string> = {
	improving: 'Narrowing',
	steady: 'Steady',
	widening: 'Widening'
};

export const DEPTH_LABELS = { shallow: 'Shallow', moderate: 'Moderate', deep: 'Deep' } as const;
export const TENSION_LABELS = { firm: 'Firm', soft: 'Soft' } as const;
export const DELIVERY_LABELS = { vaginal: 'Vaginal', caesarean: 'Caesarean' } as const;

/** "+0.5", "−1", "0" finger widths. */
/** "Widened by 1 finger width since 23 Nov 2026": the recent jump, said on its own. */
export function jumpWords(jump: {
	direction: 'widened' | 'narrowed';
	by: number;
	since: string;
}): string {
	const unit = jump.by === 1 ? 'finger width' : 'finger widths';
	const verb = jump.direction === 'widened' ? 'Widened' : 'Narrowed';
	return `${verb} by ${jump.by} ${unit} since ${formatDate(jump.since)}`;
}

export function signed(value: number): string {
	if (value === 0) return '0';
	return value > 0 ? `+${value}` : `−${Math.abs(value)}`;
}

/** Dates have one home: `$lib/dates` (re-exported here for the pages that read labels). */
export { formatDate };

/**
 * A finger width as an approximate millimetre figure, always labelled an estimate with the
 * factor it used: "≈ 30 mm, estimate at 15 mm per finger". For showing only; no criterion
 * reads it.
 */
/** "≈ 30 mm": in a table whose note says once how the estimate is made. */
export function formatMmApprox(fingers: number, mmPerFinger: number): string {
	return `≈ ${Math.round(fingersToMm(fingers, mmPerFinger))} mm`;
}

export function formatMmEstimate(fingers: number, mmPerFinger: number): string {
	return `≈ ${Math.round(fingersToMm(fingers, mmPerFinger))} mm, estimate at ${mmPerFinger} mm per finger`;
}
