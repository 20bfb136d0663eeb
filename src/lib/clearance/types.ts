import type {
	CategoryLimits,
	ClearanceLevel,
	MovementCategory,
	NewFinding
} from '$lib/domain/movement';

// Browser-safe shapes of assessments and clearances, shared by the API, the pages and the
// server (the schema stores points and levels as these).

export const MEASUREMENT_POSITIONS = ['xiphoid', 'above', 'at', 'below'] as const;
export type MeasurementPositionCode = (typeof MEASUREMENT_POSITIONS)[number];

export const MEASUREMENT_METHODS = ['palpation', 'caliper', 'ultrasound'] as const;
export type MeasurementMethod = (typeof MEASUREMENT_METHODS)[number];

export const HERNIA_FINDINGS = ['none', 'suspected', 'found'] as const;
export type HerniaFinding = (typeof HERNIA_FINDINGS)[number];

/** One measurement point of a physiotherapist's assessment. */
export interface AssessmentPoint {
	position: MeasurementPositionCode;
	/** Distance from the navel in cm; null at the xiphoid, 0 at the navel. */
	distanceCm: number | null;
	restMm: number | null;
	curlUpMm: number | null;
	method: MeasurementMethod;
	depth: 'shallow' | 'moderate' | 'deep' | null;
	tension: 'firm' | 'soft' | null;
	doming: boolean | null;
}

export type ClearanceLevels = Record<MovementCategory, ClearanceLevel>;
export type ClearanceModifications = Partial<Record<MovementCategory, string>>;

export interface ClearanceVersion {
	id: string;
	categories: ClearanceLevels;
	modifications: ClearanceModifications;
	notes: string | null;
	reviewOn: string;
	setBy: { id: string | null; name: string | null };
	clinicId: string;
	clinicName: string;
	referralId: string | null;
	setAt: string;
	sharingEndedOn: string | null;
	/** The version that replaced this one, if any. */
	supersededBy: string | null;
}

export interface ClearanceView {
	current: (ClearanceVersion & { reviewOverdue: boolean }) | null;
	effective: CategoryLimits;
	provisional: boolean;
	seeDoctorFirst: boolean;
	clearanceLapsed: boolean;
	reviewOverdue: boolean;
	newFindings: NewFinding[];
	prompts: string[];
	history: ClearanceVersion[];
	viewer: 'studio' | 'client' | 'clinic';
}

/** A clearance due for review within 14 days, or overdue, on a dashboard. */
export interface ReviewItem {
	clearanceId: string;
	clientId: string;
	clientName: string;
	reviewOn: string;
	overdue: boolean;
	/** Where the person looks at it: the client page (studio) or the referral (clinic). */
	href: string;
}
