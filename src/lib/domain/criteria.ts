import type { Site } from './sites';
import { SOURCES } from './sources';

export type CriterionUnit = 'finger_widths' | 'mm' | 'cm';

export const MODALITIES = ['palpation', 'caliper', 'ultrasound'] as const;
export type Modality = (typeof MODALITIES)[number];

/** Methods that give a real width in millimetres (palpation gives finger widths). */
export type MeasuredModality = Exclude<Modality, 'palpation'>;

/**
 * Where along the midline a criterion was defined. `any` applies wherever the width was taken;
 * `unstated` means our references do not give the site, so the criterion never matches a
 * measurement automatically.
 */
export type CriterionSite = Site | 'any' | 'xiphoid' | 'unstated';

/**
 * Whether a width was taken with the abdomen relaxed (`rest`) or during a curl-up (head and
 * shoulders lifted on an exhale). A width is only ever compared with a criterion of its own state.
 */
export const MEASUREMENT_STATES = ['rest', 'curl_up'] as const;
export type MeasurementState = (typeof MEASUREMENT_STATES)[number];

/**
 * How sure we are of a value: read in the source (`verified`), only seen in a secondary
 * source (`secondary`), or recalled (`memory`).
 */
export type CriterionStatus = 'verified' | 'secondary' | 'memory';

export interface Criterion {
	id: string;
	/** Short plain label for lists. */
	label: string;
	value: number;
	unit: CriterionUnit;
	site: CriterionSite;
	/** Distance from the navel in cm for `above_navel` / `below_navel`; 0 at the navel; else null. */
	distanceCm: number | null;
	/** Rest or curl-up, as the source measured it. */
	state: MeasurementState;
	/** How sure we are of `state`: our references do not always say in which state a width was taken. */
	stateStatus: CriterionStatus;
	/**
	 * The value as our references give it is doubtful (see `note`): it is kept for reference and
	 * left out of the physiotherapist's comparisons.
	 */
	doubtful?: boolean;
	/** A single method, or either measured method where the source defines width without one. */
	modality: Modality | 'caliper_or_ultrasound';
	/** The operator a width is judged by: past the criterion when `width <comparison> value`. */
	comparison: 'gte' | 'gt';
	/**
	 * Whether a width equal to the value is past the criterion, as the source words it. It
	 * restates `comparison` for display; the tests hold the two in step.
	 */
	inclusive: boolean;
	/**
	 * `threshold`: past it is the source's definition of separation. `upper_limit_of_normal`:
	 * past it is wider than the source's normal range, not a diagnosis by itself.
	 */
	meaning: 'threshold' | 'upper_limit_of_normal';
	/** True where the source does not say on which side of the value a width equal to it falls. */
	boundaryUnclear: boolean;
	population: string;
	status: CriterionStatus;
	note?: string;
	source: string;
}

/** Finger-width rule used for screening: OR across the three sites, 2 counts. */
export const SPERSTAD_FINGER_WIDTH: Criterion = {
	id: 'sperstad-2016-finger-width',
	label: '2 finger widths or more at any of three sites',
	value: 2,
	unit: 'finger_widths',
	site: 'any',
	distanceCm: null,
	state: 'curl_up',
	stateStatus: 'verified',
	modality: 'palpation',
	comparison: 'gte',
	inclusive: true,
	meaning: 'threshold',
	boundaryUnclear: false,
	population: 'First-time mothers, from gestation week 21 to 12 months postpartum (n = 300)',
	status: 'verified',
	note: 'Sites 4.5 cm above, at and 4.5 cm below the navel, during a curl-up.',
	source: `${SOURCES.sperstad2016}; ${SOURCES.gluppe2018}`
};

const BEER_POPULATION = 'Nulliparous women, ultrasound (n = 150)';
const BEER_NOTE = '“Up to” the value is normal; the limits are the 90th percentile, not maxima.';

export const BEER_XIPHOID: Criterion = {
	id: 'beer-2009-xiphoid',
	label: 'Normal up to 15 mm at the xiphoid',
	value: 15,
	unit: 'mm',
	site: 'xiphoid',
	distanceCm: null,
	// At rest, recalled from the paper's method (its abstract does not say): from memory.
	state: 'rest',
	stateStatus: 'memory',
	modality: 'ultrasound',
	comparison: 'gt',
	inclusive: false,
	meaning: 'upper_limit_of_normal',
	boundaryUnclear: false,
	population: BEER_POPULATION,
	status: 'verified',
	note: BEER_NOTE,
	source: SOURCES.beer2009
};

export const BEER_ABOVE_3CM: Criterion = {
	...BEER_XIPHOID,
	id: 'beer-2009-above-3cm',
	label: 'Normal up to 22 mm 3 cm above the navel',
	value: 22,
	site: 'above_navel',
	distanceCm: 3
};

export const BEER_BELOW_2CM: Criterion = {
	...BEER_XIPHOID,
	id: 'beer-2009-below-2cm',
	label: 'Normal up to 16 mm 2 cm below the navel',
	value: 16,
	site: 'below_navel',
	distanceCm: 2
};

export const EHS_2021: Criterion = {
	id: 'ehs-2021',
	label: 'Rectus diastasis: wider than 20 mm',
	value: 20,
	unit: 'mm',
	site: 'any',
	distanceCm: null,
	// The guideline's width is read at rest (from memory; our references do not say).
	state: 'rest',
	stateStatus: 'memory',
	// The guideline defines diastasis by width alone; either measured method may be compared.
	modality: 'caliper_or_ultrasound',
	comparison: 'gt',
	inclusive: false,
	meaning: 'threshold',
	boundaryUnclear: false,
	population: 'Adults considered for management of rectus diastasis',
	status: 'verified',
	note: '2.0 cm is not diastasis.',
	source: SOURCES.ehs2021
};

export const MOTA_BELOW_2CM: Criterion = {
	id: 'mota-2015-below-2cm',
	label: 'DRA: more than 16 mm 2 cm below the navel',
	value: 16,
	unit: 'mm',
	site: 'below_navel',
	distanceCm: 2,
	// At rest (from memory; our references do not say).
	state: 'rest',
	stateStatus: 'memory',
	modality: 'ultrasound',
	comparison: 'gt',
	inclusive: false,
	meaning: 'threshold',
	// The paper's wording leaves exactly 16 mm undecided; we read it as not past, and flag it.
	boundaryUnclear: true,
	population: 'Primiparous women, gestation week 35 to 6 months postpartum',
	status: 'verified',
	note: 'Whether exactly 16 mm counts is unclear in the source.',
	source: SOURCES.mota2015Criterion
};

const QU_POPULATION = 'Nulliparous women, ultrasound, 90th percentile (n = 116)';

export const QU_ABOVE_3CM: Criterion = {
	id: 'qu-2021-above-3cm',
	label: 'DRA: more than 14 mm 3 cm above the navel',
	value: 14,
	unit: 'mm',
	site: 'above_navel',
	distanceCm: 3,
	// At rest (from memory; our references do not say).
	state: 'rest',
	stateStatus: 'memory',
	modality: 'ultrasound',
	comparison: 'gt',
	inclusive: false,
	meaning: 'threshold',
	boundaryUnclear: false,
	population: QU_POPULATION,
	status: 'verified',
	note: 'Publication year from memory.',
	source: SOURCES.qu2021
};

export const QU_AT_NAVEL: Criterion = {
	...QU_ABOVE_3CM,
	id: 'qu-2021-at-navel',
	label: 'DRA: more than 20 mm at the navel',
	value: 20,
	site: 'at_navel',
	distanceCm: 0
};

export const QU_BELOW_3CM: Criterion = {
	...QU_ABOVE_3CM,
	id: 'qu-2021-below-3cm',
	label: 'DRA: more than 2 mm 3 cm below the navel',
	value: 2,
	site: 'below_navel',
	distanceCm: 3,
	doubtful: true,
	note: 'Value as given in our references (> 2 mm); it is far below the other limits, so check the original before relying on it. Publication year from memory.'
};

export const HILLS_2018: Criterion = {
	id: 'hills-2018-one-year',
	label: 'DRA at 1 year postpartum: 22 mm or more',
	value: 22,
	unit: 'mm',
	site: 'unstated',
	distanceCm: null,
	// At rest (from memory); the site is unstated, so it never matches anyway.
	state: 'rest',
	stateStatus: 'memory',
	modality: 'ultrasound',
	comparison: 'gte',
	inclusive: true,
	meaning: 'threshold',
	boundaryUnclear: false,
	population: 'Women at 1 year postpartum',
	status: 'verified',
	note: 'Method recalled as ultrasound (from memory); the measuring site is not in our references, so it is never matched automatically.',
	source: SOURCES.hills2018
};

/** Every published width criterion the product knows, finger-width rule first. */
export const CRITERIA: readonly Criterion[] = [
	SPERSTAD_FINGER_WIDTH,
	BEER_XIPHOID,
	BEER_ABOVE_3CM,
	BEER_BELOW_2CM,
	EHS_2021,
	MOTA_BELOW_2CM,
	QU_ABOVE_3CM,
	QU_AT_NAVEL,
	QU_BELOW_3CM,
	HILLS_2018
];

/** The criterion's value in the unit of a width to compare; finger widths never convert. */
export function criterionValueIn(criterion: Criterion, unit: 'mm' | 'finger_widths'): number {
	if (unit === 'finger_widths') {
		if (criterion.unit !== 'finger_widths') {
			throw new TypeError(`Criterion ${criterion.id} is not in finger widths`);
		}
		return criterion.value;
	}
	if (criterion.unit === 'mm') return criterion.value;
	if (criterion.unit === 'cm') return criterion.value * 10;
	// A finger-width rule has no honest millimetre value (Bursch 1987: raters differ).
	throw new TypeError(`Criterion ${criterion.id} is in finger widths, not millimetres`);
}

/** Whether a width, given in `unit`, is past the criterion by the criterion's own operator. */
export function isPastCriterion(
	criterion: Criterion,
	width: number,
	unit: 'mm' | 'finger_widths'
): boolean {
	const limit = criterionValueIn(criterion, unit);
	return criterion.comparison === 'gte' ? width >= limit : width > limit;
}
