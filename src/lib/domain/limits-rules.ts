import {
	MOVEMENT_CATEGORIES,
	type LimitAuthor,
	type LimitsClearance,
	type LimitsScreening,
	type MovementCategory
} from './movement';
import {
	PAIN_FLAGS,
	RED_FLAG_LABELS,
	RED_FLAG_REFER_TO,
	RED_FLAG_SOURCES,
	type RedFlag
} from './red-flags';
import { siteLabelCapitalised, SITES } from './sites';
import { SOURCES } from './sources';

/**
 * Under 6 weeks after the birth, and until the postnatal check has cleared her, everything but
 * deep stabilisation waits (UK CMO 2019 as restated by NHS pages — a secondary source).
 */
export const POSTNATAL_CHECK_WEEKS = 6;
/** Impact waits until 12 weeks: return to running not before 3 months (Goom et al. 2019). */
export const IMPACT_HOLD_WEEKS = 12;
/** After a caesarean, flexion, long-lever and high-pressure work wait until about 12 weeks (common practice, from memory). */
export const CAESAREAN_HOLD_WEEKS = 12;
/**
 * A site widened by more than this many finger widths since the clinic's last screening is a
 * new finding; half a finger width is the test's own step (trade practice, no source).
 */
export const WIDENING_FINGER_WIDTHS = 0.5;

export const NO_LIMIT_REASON = 'No limit from screenings and no clinician’s decision yet';

export const ALL: readonly MovementCategory[] = MOVEMENT_CATEGORIES;
export const ALL_BUT_DEEP_STABILITY: readonly MovementCategory[] = MOVEMENT_CATEGORIES.filter(
	(category) => category !== 'deep_stability'
);
export const FLEXION_HOLDS: readonly MovementCategory[] = ['loaded_flexion', 'long_lever'];
export const PELVIC_FLOOR_HOLDS: readonly MovementCategory[] = ['high_pressure', 'impact'];
export const BULGE_HOLDS: readonly MovementCategory[] = ['high_pressure'];
export const CAESAREAN_HOLDS: readonly MovementCategory[] = [
	'loaded_flexion',
	'long_lever',
	'high_pressure'
];
export const PELVIC_FLOOR_FLAGS: readonly RedFlag[] = ['pelvic_heaviness', 'leakage'];

/** A provisional hold from one rule, before holds on the same category are combined. */
export interface Hold {
	categories: readonly MovementCategory[];
	reason: string;
	source: string;
	by: LimitAuthor;
	seeDoctorFirst?: boolean;
}

export const DAY = /^\d{4}-\d{2}-\d{2}$/;

export function assertDay(value: string, name: string): void {
	if (!DAY.test(value) || Number.isNaN(new Date(value).getTime())) {
		throw new RangeError(`${name} must be a date as YYYY-MM-DD, not ${JSON.stringify(value)}`);
	}
}

export function dayOf(date: Date): string {
	return date.toISOString().slice(0, 10);
}

/** Oldest first by when she was screened; two taken together keep the order they were recorded. */
export function chronological(screenings: readonly LimitsScreening[]): LimitsScreening[] {
	return [...screenings].sort(
		(a, b) =>
			a.takenAt.getTime() - b.takenAt.getTime() || a.recordedAt.getTime() - b.recordedAt.getTime()
	);
}

/** The clinic had this screening when it set the clearance (recorded no later than both). */
export function knownToClearance(screening: LimitsScreening, clearance: LimitsClearance): boolean {
	const recorded = screening.recordedAt.getTime();
	return recorded <= clearance.knownUntil.getTime() && recorded <= clearance.setAt.getTime();
}

interface MedicalSign {
	screening: LimitsScreening;
	flags: RedFlag[];
	labels: string[];
	sources: string[];
}

/**
 * The signs in one screening that send her to a doctor: flags that refer to medical care on
 * their own, and a midline bulge recorded with pain (it may be a hernia; Carlstedt 2020). The
 * stored reasons are read too, so a sign classified as medical when it was taken still counts.
 */
export function medicalSignOf(screening: LimitsScreening): MedicalSign | null {
	const recorded = new Set(screening.redFlags);
	const painfulBulge =
		recorded.has('midline_bulge') && PAIN_FLAGS.some((flag) => recorded.has(flag));
	const flags = new Set<RedFlag>(
		screening.redFlags.filter((flag) => RED_FLAG_REFER_TO[flag] === 'medical')
	);
	if (painfulBulge) flags.add('midline_bulge');
	const sources = new Set<string>();
	for (const reason of screening.reasons) {
		if (reason.effect === 'refer' && reason.referTo === 'medical') {
			if (reason.flag) flags.add(reason.flag);
			sources.add(reason.source);
		}
	}
	if (flags.size === 0) return null;
	const list = [...flags];
	for (const flag of list) sources.add(RED_FLAG_SOURCES[flag]);
	if (painfulBulge) sources.add(SOURCES.carlstedt2020);
	if (screening.stage === 'postpartum') sources.add(SOURCES.niceCg37);
	const labels = list.map((flag) =>
		flag === 'midline_bulge' && painfulBulge
			? `${RED_FLAG_LABELS[flag]}, with pain`
			: RED_FLAG_LABELS[flag]
	);
	return { screening, flags: list, labels, sources: [...sources] };
}

/**
 * Medical signs still standing: each one holds until a later screening records that she was
 * seen and the sign has gone (with no such sign of its own), or a clinician's clearance set
 * after it — with the sign in the history the clinic had — lifts it.
 */
export function standingMedicalSigns(
	ordered: readonly LimitsScreening[],
	clearance: LimitsClearance | null
): MedicalSign[] {
	let active: MedicalSign[] = [];
	for (const screening of ordered) {
		const sign = medicalSignOf(screening);
		if (sign) active.push(sign);
		else if (screening.medicalSignResolved === true) active = [];
	}
	return clearance ? active.filter((sign) => !knownToClearance(sign.screening, clearance)) : active;
}

export function medicalHold(signs: readonly MedicalSign[]): Hold {
	const described = signs
		.map((sign) => `${sign.labels.join('; ')} (recorded ${dayOf(sign.screening.takenAt)})`)
		.join('; ');
	return {
		categories: ALL,
		reason: `See your doctor or midwife first: ${described}. Every movement waits until a clinician has cleared her, or a later screening records that she was seen and the sign has gone.`,
		source: [...new Set(signs.flatMap((sign) => sign.sources))].join('; '),
		by: 'screening',
		seeDoctorFirst: true
	};
}

/** Holds from her latest screening, for a client without a clinician's clearance in force. */
export function screeningHolds(latest: LimitsScreening | undefined): Hold[] {
	if (!latest) return [];
	const on = dayOf(latest.takenAt);
	const holds: Hold[] = [];
	if (latest.outcome === 'refer') {
		holds.push({
			categories: FLEXION_HOLDS,
			reason: `Her screening on ${on} calls for a referral: loaded flexion and long-lever abdominal work wait until she has been assessed.`,
			source: SOURCES.flexionPractice,
			by: 'screening'
		});
	}
	const pelvicFloor = latest.redFlags.filter((flag) => PELVIC_FLOOR_FLAGS.includes(flag));
	if (pelvicFloor.length > 0) {
		const felt = pelvicFloor.map((flag) => RED_FLAG_LABELS[flag].toLowerCase()).join('; ');
		holds.push({
			categories: PELVIC_FLOOR_HOLDS,
			reason: `Recorded on ${on}: ${felt}. High-pressure effort and impact wait until a physiotherapist has assessed her.`,
			source: SOURCES.heavinessPractice,
			by: 'screening'
		});
	}
	if (latest.redFlags.includes('midline_bulge')) {
		holds.push({
			categories: BULGE_HOLDS,
			reason: `A bulge along the midline was recorded on ${on}: heavy lifting and breath-holding effort wait until it has been reviewed (a suspected hernia needs imaging or surgical review).`,
			source: SOURCES.carlstedt2020,
			by: 'screening'
		});
	}
	if (latest.stage === 'pregnant') {
		const sites = SITES.filter(
			(site) => latest.sites[site].depth === 'deep' || latest.sites[site].doming
		);
		if (sites.length > 0) {
			holds.push({
				categories: FLEXION_HOLDS,
				reason: `In pregnancy, a deep gap or doming was felt on ${on} (${sites.map(siteLabelCapitalised).join(', ').toLowerCase()}): loaded flexion and long-lever abdominal work wait. A wide gap alone holds nothing in pregnancy.`,
				source: SOURCES.pregnancyLoadPractice,
				by: 'screening'
			});
		}
	}
	return holds;
}

/** Holds and prompts from her record: weeks since the birth, type of birth, postnatal check. */
