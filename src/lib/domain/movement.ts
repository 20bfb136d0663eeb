import type { RedFlag } from './red-flags';
import type { Outcome, ScreeningReason } from './screening';
import type { Site, SiteMeasure } from './sites';
import type { Stage } from './stage';

/**
 * The product's own movement taxonomy. A physiotherapist's clearance gives each category a
 * level; the studio's provisional limits hold some of them; session plans and home practice
 * are checked against the result (`effectiveLimits`, in limits.ts) and nothing else.
 */
export const MOVEMENT_CATEGORIES = [
	'loaded_flexion',
	'long_lever',
	'front_loaded',
	'loaded_rotation',
	'loaded_extension',
	'inversion',
	'high_pressure',
	'impact',
	'deep_stability'
] as const;
export type MovementCategory = (typeof MOVEMENT_CATEGORIES)[number];

export const MOVEMENT_CATEGORY_LABELS: Record<MovementCategory, string> = {
	loaded_flexion: 'Loaded spinal flexion',
	long_lever: 'Long-lever abdominal load',
	front_loaded: 'Front-loaded plank and four-point weight bearing',
	loaded_rotation: 'Loaded rotation',
	loaded_extension: 'Loaded extension that stretches the abdominal wall',
	inversion: 'Inversion and rolling',
	high_pressure: 'High-pressure effort (heavy lifting, breath holding)',
	impact: 'Impact',
	deep_stability: 'Deep stabilisation'
};

/** What a clinician may set for a category. */
export const CLEARANCE_LEVELS = ['cleared', 'modify', 'hold'] as const;
export type ClearanceLevel = (typeof CLEARANCE_LEVELS)[number];

/**
 * What the plan check and home practice read. `no_limit` means "no limit from screenings and
 * no clinician's decision" — never shown as cleared.
 */
export const EFFECTIVE_LEVELS = ['cleared', 'modify', 'hold', 'no_limit'] as const;
export type EffectiveLevel = (typeof EFFECTIVE_LEVELS)[number];

/** Most restrictive first; combining two levels keeps the one with the lower rank. */
export const LEVEL_RANK: Record<EffectiveLevel, number> = {
	hold: 0,
	modify: 1,
	cleared: 2,
	no_limit: 3
};

/**
 * Who a level comes from: the treating clinician's clearance, the studio's screenings, the
 * client's record (stage, birth, postnatal check), or what she reported herself.
 */
export type LimitAuthor = 'clinician' | 'screening' | 'record' | 'self_report';

export interface CategoryLimit {
	level: EffectiveLevel;
	/** Plain words: why this level. */
	reason: string;
	/** The published source, or "common practice …" / "from memory", or the clearance. */
	source: string;
	by: LimitAuthor;
	/** The clinician's written change, when `level` is `modify`. */
	modification?: string;
	/** A hold from a sign that sends her to a doctor first: nobody in the studio may lift it. */
	seeDoctorFirst?: boolean;
}

export type CategoryLimits = Record<MovementCategory, CategoryLimit>;

/** The client's record as the limits need it (dates as YYYY-MM-DD). */
export interface LimitsClient {
	stage: Stage;
	dueDate: string | null;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	postnatalCheckOn: string | null;
	/** True cleared, false not cleared, null unknown. */
	postnatalCleared: boolean | null;
}

/** One instructor's screening as the limits need it. */
export interface LimitsScreening {
	id: string;
	takenAt: Date;
	/** When it was recorded in Seamwell — what decides whether a clinic could have seen it. */
	recordedAt: Date;
	stage: Stage;
	sites: Record<Site, SiteMeasure>;
	redFlags: readonly RedFlag[];
	outcome: Outcome;
	reasons: readonly ScreeningReason[];
	/**
	 * Recorded by the instructor: she has been seen by her doctor or midwife for an earlier
	 * warning sign and it has gone. With no such sign in this screening, lifts a medical hold.
	 */
	medicalSignResolved?: boolean;
}

/**
 * Symptoms she reported herself (a self-check, or a home practice that felt wrong), as the
 * limits need them. Studio-side only when she shares her self-checks with the studio.
 */
export interface LimitsSelfReport {
	id: string;
	takenAt: Date;
	symptoms: readonly RedFlag[];
}

/** The clearance in force, as the limits need it. */
export interface LimitsClearance {
	id: string;
	setAt: Date;
	/** The client's stage when it was set: a clearance set in pregnancy lapses at the birth. */
	stageAtSet: Stage;
	levels: Record<MovementCategory, ClearanceLevel>;
	modifications: Partial<Record<MovementCategory, string>>;
	reviewOn: string;
	setByName: string;
	clinicName: string;
	/**
	 * The clinic had every screening recorded up to this moment (the history shared with it when
	 * the clearance was set); anything recorded later is a finding it did not have.
	 */
	knownUntil: Date;
	/** Set when the client withdrew sharing: the studio keeps the last clearance it received. */
	sharingEndedOn?: string | null;
}

export type NewFindingKind =
	'red_flag' | 'newly_at_threshold' | 'widened' | 'newly_deep' | 'newly_soft' | 'newly_doming';

export interface NewFinding {
	kind: NewFindingKind;
	screeningId: string;
	site?: Site;
	flag?: RedFlag;
	detail: string;
	/** The categories this finding puts back on hold over the clearance. */
	holds?: MovementCategory[];
}

export interface EffectiveLimits {
	categories: CategoryLimits;
	/** No clinician's clearance in force: every level comes from the studio's caution. */
	provisional: boolean;
	/** A sign that refers to a doctor holds everything. */
	seeDoctorFirst: boolean;
	/** Findings recorded after the clinic's clearance, with the holds they put back on. */
	newFindings: NewFinding[];
	reviewOverdue: boolean;
	/** A clearance set in pregnancy, lapsed at the birth. */
	clearanceLapsed: boolean;
	/** Things to record, such as the postnatal check's result after 6 weeks. */
	prompts: string[];
}
