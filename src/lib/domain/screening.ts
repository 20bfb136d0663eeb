import { isPastCriterion, SPERSTAD_FINGER_WIDTH } from './criteria';
import {
	isPregnancyWarningSign,
	PAIN_FLAGS,
	RED_FLAG_LABELS,
	RED_FLAG_REFER_TO,
	RED_FLAG_SOURCES,
	RED_FLAGS,
	type RedFlag,
	type ReferTo
} from './red-flags';
import {
	formatFingerWidths,
	isValidFingerWidth,
	SITE_LABELS,
	siteLabelCapitalised,
	SITES,
	type Site,
	type SiteMeasure
} from './sites';
import { SOURCES } from './sources';
import type { StageContext } from './stage';

export const OUTCOMES = ['within_limit', 'monitor', 'refer'] as const;
export type Outcome = (typeof OUTCOMES)[number];

export type ReasonCode =
	| 'width_at_or_over_threshold'
	| 'width_expected_in_pregnancy'
	| 'deep_gap'
	| 'soft_midline'
	| 'doming'
	| 'red_flag'
	| 'painful_midline_bulge'
	| 'all_sites_under_threshold';

export interface ScreeningReason {
	code: ReasonCode;
	/** The outcome this reason calls for on its own; the screening takes the strongest. */
	effect: Outcome;
	site?: Site;
	flag?: RedFlag;
	detail: string;
	source: string;
	/** Set on every `refer` reason. */
	referTo?: ReferTo;
	criterionId?: string;
}

export interface ScreeningInput {
	sites: Record<Site, SiteMeasure>;
	redFlags: readonly RedFlag[];
	context: StageContext;
}

export interface ScreeningResult {
	outcome: Outcome;
	/** Strongest first: refer to a doctor, refer to a physio, monitor, within limit. */
	reasons: ScreeningReason[];
}

const PHYSIO_WORDS = 'refer to a pelvic-health physiotherapist';
const PREGNANCY_WATCH_WORDS =
	'in pregnancy this is watched at each screening rather than referred, unless a warning sign appears';

function assertValidInput(input: ScreeningInput): void {
	for (const site of SITES) {
		const measure = input.sites[site];
		if (measure === undefined) {
			throw new TypeError(`The screening has no measure ${SITE_LABELS[site]}`);
		}
		if (!isValidFingerWidth(measure.widthFingers)) {
			throw new RangeError(
				`Width ${SITE_LABELS[site]} must be 0 to 6 finger widths in half steps, not ${measure.widthFingers}`
			);
		}
		const mm = measure.widthMm;
		if (mm !== undefined && mm !== null && (!Number.isFinite(mm) || mm < 0)) {
			throw new RangeError(`Width in mm ${SITE_LABELS[site]} must be 0 or more`);
		}
	}
}

/**
 * Width, depth, tension and doming at one site. After the birth each finding refers to a
 * physiotherapist. In pregnancy a wide gap is expected (Mota et al. 2015: separation in every
 * participant at week 35), so it is monitored; Mota reports width only, and monitoring a deep,
 * soft or doming midline in pregnancy the same way is our own reading of the stretched wall.
 */
function siteReasons(site: Site, measure: SiteMeasure, pregnant: boolean): ScreeningReason[] {
	const where = siteLabelCapitalised(site);
	const gap = `a gap of ${formatFingerWidths(measure.widthFingers)}`;
	const reasons: ScreeningReason[] = [];

	if (isPastCriterion(SPERSTAD_FINGER_WIDTH, measure.widthFingers, 'finger_widths')) {
		const threshold = formatFingerWidths(SPERSTAD_FINGER_WIDTH.value);
		reasons.push(
			pregnant
				? {
						code: 'width_expected_in_pregnancy',
						effect: 'monitor',
						site,
						detail: `${where}: ${gap}, at or over ${threshold}. A wide gap is expected late in pregnancy, so it is monitored, not referred.`,
						source: `${SOURCES.mota2015}; ${SPERSTAD_FINGER_WIDTH.source}`,
						criterionId: SPERSTAD_FINGER_WIDTH.id
					}
				: {
						code: 'width_at_or_over_threshold',
						effect: 'refer',
						referTo: 'physio',
						site,
						detail: `${where}: ${gap}, at or over the ${threshold} threshold — ${PHYSIO_WORDS}.`,
						source: `${SPERSTAD_FINGER_WIDTH.source}; ${SOURCES.fingerWidthThresholdPractice}`,
						criterionId: SPERSTAD_FINGER_WIDTH.id
					}
		);
	}

	const findings: Array<{
		code: 'deep_gap' | 'soft_midline' | 'doming';
		felt: string;
		source: string;
	}> = [];
	if (measure.depth === 'deep') {
		findings.push({
			code: 'deep_gap',
			felt: `the fingers sink deep into ${gap}`,
			source: SOURCES.deepOrSoftPractice
		});
	}
	if (measure.tension === 'soft') {
		findings.push({
			code: 'soft_midline',
			felt: `the midline feels soft, with ${gap}`,
			source: SOURCES.deepOrSoftPractice
		});
	}
	if (measure.doming) {
		findings.push({
			code: 'doming',
			felt: `the belly domes along the midline, with ${gap}`,
			source: SOURCES.domingPractice
		});
	}
	for (const finding of findings) {
		reasons.push(
			pregnant
				? {
						code: finding.code,
						effect: 'monitor',
						site,
						detail: `${where}: ${finding.felt}; ${PREGNANCY_WATCH_WORDS}.`,
						source: `${finding.source}; ${SOURCES.mota2015}`
					}
				: {
						code: finding.code,
						effect: 'refer',
						referTo: 'physio',
						site,
						detail: `${where}: ${finding.felt} — ${PHYSIO_WORDS} whatever the width.`,
						source: finding.source
					}
		);
	}
	return reasons;
}

function referWords(referTo: ReferTo, pregnancyWarning: boolean): string {
	if (referTo === 'physio') return `${PHYSIO_WORDS} whatever the width`;
	return pregnancyWarning
		? 'stop exercise and seek medical care'
		: 'refer to a doctor, urgently where the sign calls for it';
}

/**
 * One reason per red flag. A midline bulge counts as painful when any pain flag is recorded
 * with it: an instructor cannot tell where the pain comes from, a painful bulge may be a
 * hernia, and a suspected hernia needs imaging or surgical review (Carlstedt et al. 2020), so
 * the safer reading sends it to a doctor. The pain flags still give their own reasons.
 */
function redFlagReasons(redFlags: readonly RedFlag[]): ScreeningReason[] {
	const recorded = new Set(redFlags);
	const painFlags = PAIN_FLAGS.filter((flag) => recorded.has(flag));
	return RED_FLAGS.filter((flag) => recorded.has(flag)).map((flag): ScreeningReason => {
		if (flag === 'midline_bulge' && painFlags.length > 0) {
			const pains = painFlags.map((pain) => RED_FLAG_LABELS[pain].toLowerCase()).join(', ');
			return {
				code: 'painful_midline_bulge',
				effect: 'refer',
				referTo: 'medical',
				flag,
				detail: `${RED_FLAG_LABELS[flag]}, with pain (${pains}): it may be a hernia — refer to a doctor for review.`,
				source: `${RED_FLAG_SOURCES[flag]}; ${SOURCES.carlstedt2020}`
			};
		}
		const referTo = RED_FLAG_REFER_TO[flag];
		return {
			code: 'red_flag',
			effect: 'refer',
			referTo,
			flag,
			detail: `${RED_FLAG_LABELS[flag]}: ${referWords(referTo, isPregnancyWarningSign(flag))}.`,
			source: RED_FLAG_SOURCES[flag]
		};
	});
}

function withinLimitReason(sites: Record<Site, SiteMeasure>): ScreeningReason {
	const widths = SITES.map(
		(site) => `${formatFingerWidths(sites[site].widthFingers)} ${SITE_LABELS[site]}`
	).join(', ');
	return {
		code: 'all_sites_under_threshold',
		effect: 'within_limit',
		detail: `Every site is under ${formatFingerWidths(SPERSTAD_FINGER_WIDTH.value)} (${widths}), with no deep gap, soft midline, doming or red flag.`,
		source: SPERSTAD_FINGER_WIDTH.source,
		criterionId: SPERSTAD_FINGER_WIDTH.id
	};
}

function urgencyRank(reason: ScreeningReason): number {
	if (reason.effect === 'refer') return reason.referTo === 'medical' ? 0 : 1;
	return reason.effect === 'monitor' ? 2 : 3;
}

/**
 * Classify one screening by width, depth, tension, doming and red flags.
 *
 * - Width: 2 finger widths or more at any site (inclusive, OR across sites; Sperstad et al.
 *   2016) refers to a physio after the birth, and is monitored in pregnancy (Mota et al. 2015).
 *   Under 2 is within limit after the birth: Sperstad's definition counts it as no diastasis,
 *   and no published source gives a narrower "watch" band, so none is invented here.
 * - A deep gap, a soft midline or doming refers to a physio after the birth (common practice,
 *   informed by Lee & Hodges 2016) and is monitored in pregnancy.
 * - Red flags refer in either stage: to a doctor for late bleeding, a painful midline bulge and
 *   the pregnancy warning signs; to a physio for the rest.
 */
export function classifyScreening(input: ScreeningInput): ScreeningResult {
	assertValidInput(input);
	const pregnant = input.context.stage === 'pregnant';
	const reasons = [
		...redFlagReasons(input.redFlags),
		...SITES.flatMap((site) => siteReasons(site, input.sites[site], pregnant))
	];
	if (reasons.length === 0) {
		return { outcome: 'within_limit', reasons: [withinLimitReason(input.sites)] };
	}
	// Array.prototype.sort is stable, so equal ranks keep flag order, then site order.
	reasons.sort((a, b) => urgencyRank(a) - urgencyRank(b));
	const outcome: Outcome = reasons.some((reason) => reason.effect === 'refer')
		? 'refer'
		: 'monitor';
	return { outcome, reasons };
}

/** Whom the screening sends the client to: a doctor over a physio; null when no referral. */
export function referralTarget(result: ScreeningResult): ReferTo | null {
	const targets = result.reasons.map((reason) => reason.referTo);
	if (targets.includes('medical')) return 'medical';
	if (targets.includes('physio')) return 'physio';
	return null;
}
