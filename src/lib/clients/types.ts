import type { ClearanceStatus } from '$lib/clearance/words';
import type {
	ChartPoint,
	EarlyScreenWarning,
	Outcome,
	RedFlag,
	ScreeningReason,
	Site,
	SiteMeasure,
	SiteTrend
} from '$lib/domain';

// What the client services answer, shared with the pages and the browser.

export interface ClientSummary {
	id: string;
	name: string;
	email: string | null;
	stage: 'pregnant' | 'postpartum';
	lastScreenedAt: string | null;
	lastOutcome: Outcome | null;
	/** The list badge: her clearance, or the studio's provisional limits (lists only). */
	clearanceStatus?: ClearanceStatus;
}

export interface ClientDetail extends ClientSummary {
	organisationId: string;
	birthYear: number | null;
	dueDate: string | null;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	births: number | null;
	multiples: boolean | null;
	postnatalCheckOn: string | null;
	postnatalCleared: boolean | null;
	notes: string | null;
	intakeConsent: { at: string; method: string; takenBy: string | null } | null;
	/** Whether a person is linked to the record (she has been invited to sign in). */
	signInLinked: boolean;
	/** Weeks of gestation or weeks since the birth, today. */
	weeksNow: number | null;
}

export interface ScreeningView {
	id: string;
	takenAt: string;
	sites: Record<Site, SiteMeasure>;
	redFlags: RedFlag[];
	notes: string | null;
	stage: 'pregnant' | 'postpartum';
	weeksPostpartum: number | null;
	weeksOfGestation: number | null;
	outcome: Outcome;
	reasons: ScreeningReason[];
	warnings: EarlyScreenWarning[];
	rulesVersion: string;
}

export interface TrendView {
	direction: SiteTrend['direction'];
	changeSinceFirst: number | null;
	changeSincePrevious: number | null;
	changePerWeek: number | null;
	/** A change of more than half a finger width since the previous screening. */
	jump: { direction: 'widened' | 'narrowed'; by: number; since: string } | null;
}

export type TrendBySite = Record<Site, TrendView>;

export interface ScreeningHistory {
	items: ScreeningView[];
	trend: TrendBySite;
	series: Record<Site, ChartPoint[]>;
}

export interface RecordedScreening {
	id: string;
	outcome: Outcome;
	reasons: ScreeningReason[];
	warnings: EarlyScreenWarning[];
	stage: 'pregnant' | 'postpartum';
	weeksPostpartum: number | null;
	weeksOfGestation: number | null;
}

/**
 * The millimetres per finger width the viewing examiner reads finger widths at: her own, or
 * the default when she has set none. For showing an approximate mm estimate beside a finger
 * width — never for a criterion.
 */
export interface FingerFactor {
	mmPerFinger: number;
	/** True when she has set none and the default applies. */
	isDefault: boolean;
}
