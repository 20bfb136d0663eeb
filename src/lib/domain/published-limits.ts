import {
	CRITERIA,
	criterionValueIn,
	isPastCriterion,
	type Criterion,
	type MeasuredModality
} from './criteria';

/** Where a physiotherapist measured: at the navel, the xiphoid, or a distance above or below. */
export type MeasurementPosition =
	| { site: 'xiphoid' }
	| { site: 'at_navel' }
	| { site: 'above_navel' | 'below_navel'; distanceCm: number };

/**
 * A width measured in millimetres. The method is a measured one by type: a finger-width
 * estimate converted to mm must never meet a mm criterion (Bursch 1987; Benjamin et al.:
 * finger width agrees with ultrasound only within 18 mm).
 */
export interface MeasuredWidth {
	position: MeasurementPosition;
	method: MeasuredModality;
	widthMm: number;
}

export interface CriterionComparison {
	criterion: Criterion;
	exceeded: boolean;
	/** The width sits exactly on a value whose side the source leaves open. */
	boundaryUnclear: boolean;
	/** Defined at this very site (false for criteria that apply anywhere along the midline). */
	siteSpecific: boolean;
	detail: string;
	source: string;
}

export interface PublishedLimitsComparison {
	matches: CriterionComparison[];
	/** No criterion was defined at this site with this method; only general ones (if any) apply. */
	noSiteSpecificCriterion: boolean;
	detail: string;
}

/** Distances are read to the millimetre, so float noise never splits 3 from 3.0000001. */
const DISTANCE_TOLERANCE_CM = 0.05;

const METHOD_LABELS: Record<MeasuredModality, string> = {
	caliper: 'calipers',
	ultrasound: 'ultrasound'
};

export function positionLabel(position: MeasurementPosition): string {
	if (position.site === 'xiphoid') return 'at the xiphoid';
	if (position.site === 'at_navel') return 'at the navel';
	const side = position.site === 'above_navel' ? 'above' : 'below';
	return `${position.distanceCm} cm ${side} the navel`;
}

function methodMatches(criterion: Criterion, method: MeasuredModality): boolean {
	return criterion.modality === method || criterion.modality === 'caliper_or_ultrasound';
}

function siteMatches(criterion: Criterion, position: MeasurementPosition): boolean {
	if (criterion.site === 'any') return true;
	if (criterion.site === 'unstated') return false;
	if (criterion.site !== position.site) return false;
	if (position.site === 'above_navel' || position.site === 'below_navel') {
		return (
			criterion.distanceCm !== null &&
			Math.abs(criterion.distanceCm - position.distanceCm) < DISTANCE_TOLERANCE_CM
		);
	}
	return true;
}

function describeComparison(
	criterion: Criterion,
	widthMm: number,
	exceeded: boolean,
	boundaryUnclear: boolean
): string {
	const limit = criterionValueIn(criterion, 'mm');
	if (boundaryUnclear) {
		return `${widthMm} mm is exactly the ${limit} mm value of “${criterion.label}”; the source does not say whether this counts, so it is read as not past it — judge it clinically.`;
	}
	const pastWords =
		criterion.meaning === 'upper_limit_of_normal'
			? `wider than the normal limit of ${limit} mm`
			: `past the threshold (${criterion.label})`;
	const withinWords =
		criterion.meaning === 'upper_limit_of_normal'
			? `within the normal limit of ${limit} mm`
			: `not past the threshold (${criterion.label})`;
	return `${widthMm} mm is ${exceeded ? pastWords : withinWords}.`;
}

function assertMeasuredWidth(measure: MeasuredWidth): void {
	// The type already refuses palpation; this guards callers that bypass the type system.
	const method: string = measure.method;
	if (method !== 'caliper' && method !== 'ultrasound') {
		throw new TypeError('Only caliper or ultrasound widths may be compared with mm criteria');
	}
	if (!Number.isFinite(measure.widthMm) || measure.widthMm < 0) {
		throw new RangeError('widthMm must be a finite number of millimetres, 0 or more');
	}
	const position = measure.position;
	if (position.site === 'above_navel' || position.site === 'below_navel') {
		if (!Number.isFinite(position.distanceCm) || position.distanceCm <= 0) {
			throw new RangeError('distanceCm must be a positive number of centimetres');
		}
	}
}

/**
 * Compare a measured width with every published criterion defined at the same site and for
 * the same method, naming each source. Criteria defined elsewhere are left out rather than
 * stretched to fit; the result says so when nothing site-specific applies.
 */
export function compareWithPublishedLimits(
	measure: MeasuredWidth,
	criteria: readonly Criterion[] = CRITERIA
): PublishedLimitsComparison {
	assertMeasuredWidth(measure);
	const { position, method, widthMm } = measure;
	const matches = criteria
		.filter((criterion) => methodMatches(criterion, method) && siteMatches(criterion, position))
		.map((criterion): CriterionComparison => {
			const exceeded = isPastCriterion(criterion, widthMm, 'mm');
			const boundaryUnclear =
				criterion.boundaryUnclear && widthMm === criterionValueIn(criterion, 'mm');
			return {
				criterion,
				exceeded,
				boundaryUnclear,
				siteSpecific: criterion.site !== 'any',
				detail: describeComparison(criterion, widthMm, exceeded, boundaryUnclear),
				source: criterion.source
			};
		});
	const noSiteSpecificCriterion = !matches.some((match) => match.siteSpecific);
	const where = `${positionLabel(position)} by ${METHOD_LABELS[method]}`;
	let detail: string;
	if (matches.length === 0) {
		detail = `No published criterion matches a width taken ${where}.`;
	} else if (noSiteSpecificCriterion) {
		const general = matches.map((match) => match.criterion.label).join('; ');
		detail = `No matching site-specific criterion: no published limit is defined ${where}. Only the general definition applies: ${general}.`;
	} else {
		detail = `${matches.length} published ${matches.length === 1 ? 'criterion matches' : 'criteria match'} a width taken ${where}.`;
	}
	return { matches, noSiteSpecificCriterion, detail };
}
