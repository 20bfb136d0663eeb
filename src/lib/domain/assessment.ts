import {
	CRITERIA,
	MEASUREMENT_STATES,
	MODALITIES,
	type Criterion,
	type MeasuredModality,
	type MeasurementState,
	type Modality
} from './criteria';
import { compareWithPublishedLimits, type MeasurementPosition } from './published-limits';
import { gradeSeverity, type KeramidasGrade, type ReinpoldGrade } from './severity';
import { DEPTHS, TENSIONS, type Depth, type Tension } from './sites';
import { SOURCES } from './sources';

/** Where the physiotherapist measured along the midline. */
export const ASSESSMENT_POSITIONS = ['xiphoid', 'above', 'at', 'below'] as const;
export type AssessmentPosition = (typeof ASSESSMENT_POSITIONS)[number];

/** How the width was measured; palpation gives an estimate that is never compared. */
export const MEASUREMENT_METHODS = MODALITIES;
export type MeasurementMethod = Modality;

export const HERNIA_FINDINGS = ['none', 'suspected', 'found'] as const;
export type HerniaFinding = (typeof HERNIA_FINDINGS)[number];

/** Distance from the navel in cm, for points above or below it. */
export const ASSESSMENT_DISTANCE_MIN_CM = 0;
export const ASSESSMENT_DISTANCE_MAX_CM = 15;
/** A width at rest or during a curl-up, in mm. */
export const ASSESSMENT_WIDTH_MIN_MM = 0;
export const ASSESSMENT_WIDTH_MAX_MM = 150;

/** One measurement point of a physiotherapist's assessment. */
export interface AssessmentPoint {
	position: AssessmentPosition;
	/** Required above or below the navel (more than 0, at most 15); 0 or absent at it; absent at the xiphoid. */
	distanceCm?: number | null;
	restMm?: number | null;
	curlUpMm?: number | null;
	method: MeasurementMethod;
	depth?: Depth | null;
	tension?: Tension | null;
	doming?: boolean | null;
}

export interface AssessmentPointProblem {
	field: keyof AssessmentPoint;
	message: string;
}

function given<T>(value: T | null | undefined): value is T {
	return value !== undefined && value !== null;
}

function widthProblem(value: number | null | undefined): string | null {
	if (!given(value)) return null;
	if (
		!Number.isFinite(value) ||
		value < ASSESSMENT_WIDTH_MIN_MM ||
		value > ASSESSMENT_WIDTH_MAX_MM
	) {
		return `must be ${ASSESSMENT_WIDTH_MIN_MM} to ${ASSESSMENT_WIDTH_MAX_MM} mm`;
	}
	return null;
}

/**
 * Everything wrong with one point, in words a form can show beside the field; empty when it is
 * valid. The server's schema says the same; this keeps the rules next to the comparisons.
 */
export function assessmentPointProblems(point: AssessmentPoint): AssessmentPointProblem[] {
	const problems: AssessmentPointProblem[] = [];
	if (!(ASSESSMENT_POSITIONS as readonly string[]).includes(point.position)) {
		problems.push({ field: 'position', message: 'must be xiphoid, above, at or below' });
	}
	if (!(MEASUREMENT_METHODS as readonly string[]).includes(point.method)) {
		problems.push({ field: 'method', message: 'must be palpation, caliper or ultrasound' });
	}
	const distance = point.distanceCm;
	if (point.position === 'xiphoid' && given(distance)) {
		problems.push({ field: 'distanceCm', message: 'no distance at the xiphoid' });
	} else if (point.position === 'at' && given(distance) && distance !== 0) {
		problems.push({ field: 'distanceCm', message: 'no distance at the navel' });
	} else if (point.position === 'above' || point.position === 'below') {
		if (!given(distance)) {
			problems.push({
				field: 'distanceCm',
				message: `the distance ${point.position} the navel is required`
			});
		} else if (
			!Number.isFinite(distance) ||
			distance <= ASSESSMENT_DISTANCE_MIN_CM ||
			distance > ASSESSMENT_DISTANCE_MAX_CM
		) {
			problems.push({
				field: 'distanceCm',
				message: `must be more than ${ASSESSMENT_DISTANCE_MIN_CM} and at most ${ASSESSMENT_DISTANCE_MAX_CM} cm`
			});
		}
	}
	const rest = widthProblem(point.restMm);
	if (rest) problems.push({ field: 'restMm', message: rest });
	const curlUp = widthProblem(point.curlUpMm);
	if (curlUp) problems.push({ field: 'curlUpMm', message: curlUp });
	if (!given(point.restMm) && !given(point.curlUpMm)) {
		problems.push({ field: 'restMm', message: 'give a width at rest, during a curl-up, or both' });
	}
	if (given(point.depth) && !(DEPTHS as readonly string[]).includes(point.depth)) {
		problems.push({ field: 'depth', message: 'must be shallow, moderate or deep' });
	}
	if (given(point.tension) && !(TENSIONS as readonly string[]).includes(point.tension)) {
		problems.push({ field: 'tension', message: 'must be firm or soft' });
	}
	return problems;
}

function assertValidPoint(point: AssessmentPoint): void {
	const problems = assessmentPointProblems(point);
	if (problems.length > 0) {
		const words = problems.map((problem) => `${problem.field} ${problem.message}`).join('; ');
		throw new RangeError(`Invalid measurement point: ${words}`);
	}
}

/** The point as the published-limits matcher reads it. */
function toPosition(point: AssessmentPoint): MeasurementPosition {
	if (point.position === 'xiphoid') return { site: 'xiphoid' };
	if (point.position === 'at') return { site: 'at_navel' };
	return {
		site: point.position === 'above' ? 'above_navel' : 'below_navel',
		distanceCm: point.distanceCm ?? 0
	};
}

export function assessmentPointLabel(point: AssessmentPoint): string {
	if (point.position === 'xiphoid') return 'at the xiphoid';
	if (point.position === 'at') return 'at the navel';
	return `${point.distanceCm} cm ${point.position} the navel`;
}

const STATE_LABELS: Record<MeasurementState, string> = {
	rest: 'at rest',
	curl_up: 'during a curl-up'
};

function widthIn(point: AssessmentPoint, state: MeasurementState): number | null {
	const value = state === 'rest' ? point.restMm : point.curlUpMm;
	return given(value) ? value : null;
}

function isMeasured(method: MeasurementMethod): method is MeasuredModality {
	return method === 'caliper' || method === 'ultrasound';
}

export interface PointComparison {
	criterionId: string;
	criterionLabel: string;
	source: string;
	state: MeasurementState;
	widthMm: number;
	/** `above`: past the criterion by its own operator; `within`: not past it. */
	verdict: 'within' | 'above';
	/** The width sits exactly on a value whose side the source leaves open. */
	boundaryUnclear: boolean;
	/** Our references do not say in which state the source measured; recalled from memory. */
	stateFromMemory: boolean;
	detail: string;
}

/** Only criteria with a trustworthy value in mm, defined for this state. */
function criteriaFor(state: MeasurementState): Criterion[] {
	return CRITERIA.filter(
		(criterion) =>
			criterion.unit !== 'finger_widths' && !criterion.doubtful && criterion.state === state
	);
}

/**
 * Compare each width of a point (at rest, during a curl-up) with the published criteria of the
 * same state, method and point, naming each criterion and source. Palpation is never compared
 * (Bursch 1987: raters differ; Benjamin et al. 2020: finger width agrees with ultrasound only
 * within 18 mm). Criteria with a doubtful value (Qu's "> 2 mm at 3 cm below") are left out.
 * Points match criteria as tightly as the screening comparisons do (within 0.05 cm).
 */
export function compareMeasurementPoint(point: AssessmentPoint): PointComparison[] {
	assertValidPoint(point);
	const method = point.method;
	if (!isMeasured(method)) return [];
	const position = toPosition(point);
	return MEASUREMENT_STATES.flatMap((state) => {
		const widthMm = widthIn(point, state);
		if (widthMm === null) return [];
		const result = compareWithPublishedLimits({ position, method, widthMm }, criteriaFor(state));
		return result.matches.map((match): PointComparison => ({
			criterionId: match.criterion.id,
			criterionLabel: match.criterion.label,
			source: match.source,
			state,
			widthMm,
			verdict: match.exceeded ? 'above' : 'within',
			boundaryUnclear: match.boundaryUnclear,
			stateFromMemory: match.criterion.stateStatus === 'memory',
			detail: `${capitalise(STATE_LABELS[state])}: ${match.detail}`
		}));
	});
}

export interface PointGrade {
	widthMm: number;
	reinpold: {
		grade: ReinpoldGrade;
		range: string;
		source: string;
		/** W3 is seen only in a secondary source: show it as such. */
		secondarySource: boolean;
	};
	keramidas: { grade: KeramidasGrade | null; range: string; source: string };
	definition: { detail: string; source: string };
	notes: string[];
}

/**
 * A rest width above 2 cm by caliper or ultrasound: the EHS 2021 definition of rectus
 * diastasis and the Reinpold 2019 grade (W3 from a secondary source). Null otherwise.
 */
export function gradeMeasurementPoint(point: AssessmentPoint): PointGrade | null {
	assertValidPoint(point);
	const restMm = widthIn(point, 'rest');
	if (!isMeasured(point.method) || restMm === null) return null;
	const grade = gradeSeverity(restMm);
	if (grade === null) return null;
	return {
		widthMm: restMm,
		reinpold: { ...grade.reinpold, secondarySource: grade.reinpold.grade === 'W3' },
		keramidas: grade.keramidas,
		definition: {
			detail: `${restMm} mm at rest is wider than 2 cm: rectus diastasis by the European Hernia Society definition.`,
			source: SOURCES.ehs2021
		},
		notes: grade.notes
	};
}

export interface HerniaAdvice {
	finding: Exclude<HerniaFinding, 'none'>;
	detail: string;
	source: string;
}

/** A hernia suspected or found needs imaging or surgical review (Carlstedt et al. 2020). */
export function herniaAdvice(hernia: HerniaFinding): HerniaAdvice | null {
	if (hernia === 'none') return null;
	return {
		finding: hernia,
		detail: `Hernia ${hernia}: imaging or surgical review.`,
		source: SOURCES.carlstedt2020
	};
}

export interface PointFindings {
	point: AssessmentPoint;
	label: string;
	comparisons: PointComparison[];
	grade: PointGrade | null;
	/** Why nothing was compared, when nothing was. */
	notes: string[];
}

export interface AssessmentComparisons {
	points: PointFindings[];
	hernia: HerniaAdvice | null;
}

/** Every comparison, grade and advice of one assessment, for the physiotherapist's screen. */
export function compareAssessment(assessment: {
	points: readonly AssessmentPoint[];
	hernia: HerniaFinding;
}): AssessmentComparisons {
	const points = assessment.points.map((point): PointFindings => {
		const comparisons = compareMeasurementPoint(point);
		const notes: string[] = [];
		if (!isMeasured(point.method)) {
			notes.push(
				`Palpation is not compared with millimetre criteria: finger-width estimates differ between raters and agree with ultrasound only within 18 mm (${SOURCES.bursch1987}; ${SOURCES.benjamin2020}).`
			);
		} else if (comparisons.length === 0) {
			notes.push(
				`No published criterion matches a width taken ${assessmentPointLabel(point)} by ${point.method} in this state.`
			);
		}
		return {
			point,
			label: assessmentPointLabel(point),
			comparisons,
			grade: gradeMeasurementPoint(point),
			notes
		};
	});
	return { points, hernia: herniaAdvice(assessment.hernia) };
}

/**
 * Ultrasound minimal detectable change between raters: 0.64–1.97 cm by point (Keshwani et al.
 * 2016). The per-point figures are not in our references, so the largest, 1.97 cm, applies at
 * every point: a change must exceed it to count.
 */
export const ULTRASOUND_MDC_MM = 19.7;

/** Points closer than this are the same point (as tight as the criteria matching). */
const SAME_POINT_TOLERANCE_CM = 0.05;

export interface WidthChange {
	state: MeasurementState;
	fromMm: number;
	toMm: number;
	changeMm: number;
	minimalDetectableChangeMm: number;
	detectable: boolean;
	detail: string;
	source: string;
}

function samePoint(a: AssessmentPoint, b: AssessmentPoint): boolean {
	if (a.position !== b.position) return false;
	if (a.position !== 'above' && a.position !== 'below') return true;
	return Math.abs((a.distanceCm ?? 0) - (b.distanceCm ?? 0)) < SAME_POINT_TOLERANCE_CM;
}

/**
 * The change in width from an earlier point `a` to a later point `b`, per state measured in
 * both. Only ultrasound at the same point and state is compared; otherwise the list is empty
 * (no published minimal detectable change for calipers, and palpation is never compared).
 */
export function detectableChange(a: AssessmentPoint, b: AssessmentPoint): WidthChange[] {
	assertValidPoint(a);
	assertValidPoint(b);
	if (a.method !== 'ultrasound' || b.method !== 'ultrasound' || !samePoint(a, b)) return [];
	return MEASUREMENT_STATES.flatMap((state): WidthChange[] => {
		const fromMm = widthIn(a, state);
		const toMm = widthIn(b, state);
		if (fromMm === null || toMm === null) return [];
		// Hundredths of a mm, so float noise never pushes a change across the limit.
		const changeMm = Math.round((toMm - fromMm) * 100) / 100;
		const detectable = Math.abs(changeMm) > ULTRASOUND_MDC_MM;
		const direction = changeMm > 0 ? 'wider' : 'narrower';
		const size = `${Math.abs(changeMm)} mm ${direction}`;
		const where = `${assessmentPointLabel(b)} ${STATE_LABELS[state]}`;
		return [
			{
				state,
				fromMm,
				toMm,
				changeMm,
				minimalDetectableChangeMm: ULTRASOUND_MDC_MM,
				detectable,
				detail: detectable
					? `${capitalise(where)}: ${size}, more than the ${ULTRASOUND_MDC_MM} mm that ultrasound can tell apart between raters — a detectable change.`
					: `${capitalise(where)}: ${changeMm === 0 ? 'no change' : size}, within the ${ULTRASOUND_MDC_MM} mm that ultrasound can tell apart between raters — no detectable change.`,
				source: SOURCES.keshwani2016
			}
		];
	});
}

function capitalise(text: string): string {
	return text.charAt(0).toUpperCase() + text.slice(1);
}
