import type { ScreeningView } from '$lib/clients/types';
import type { ConsentStatus } from '$lib/domain/consent';
import type { RedFlag } from '$lib/domain/red-flags';
import type { ReferralState, Urgency } from '$lib/domain/referral';

// What the referral services answer, shared with the pages and the browser.

export interface ClinicItem {
	id: string;
	name: string;
	physiotherapists: Array<{ id: string; name: string }>;
}

export interface ReferralListItem {
	id: string;
	state: ReferralState;
	/** Null once the studio erased the client's record (the clinic keeps the referral). */
	clientId: string | null;
	clinicId: string;
	physioId: string | null;
	urgency: Urgency;
	createdAt: string;
	sentAt: string | null;
	clientName: string;
	studioId: string;
	studioName: string;
	clinicName: string;
	physioName: string | null;
	/** When the studio erased the client's record; only the clinic still sees the referral. */
	studioErasedAt: string | null;
}

export interface ReferralHistoryEntry {
	from: ReferralState | null;
	to: ReferralState;
	at: string;
	byName: string | null;
	byRole: string | null;
	reason: string | null;
}

export interface ReferralClient {
	name: string;
	birthYear: number | null;
	stage: 'pregnant' | 'postpartum';
	dueDate: string | null;
	birthDate: string | null;
	delivery: 'vaginal' | 'caesarean' | null;
	births: number | null;
	multiples: boolean | null;
	postnatalCheckOn: string | null;
	postnatalCleared: boolean | null;
}

/** A screening as the clinic receives it: the studio's view without its form-time warnings. */
export type ReferralScreening = Omit<ScreeningView, 'warnings' | 'rulesVersion'>;

export interface ReferralAction {
	to: ReferralState;
	reasonRequired: boolean;
}

export interface ReferralDetail extends ReferralListItem {
	reason: string;
	redFlags: RedFlag[];
	createdById: string | null;
	createdByName: string | null;
	/** Which side the reader stands on. */
	viewer: 'studio' | 'clinic';
	/** From the copy the clinic received; for a draft, the record as it is now. */
	client: ReferralClient;
	history: ReferralHistoryEntry[];
	/** The screening history copied when it was sent (for a draft: as it stands now). */
	screenings: ReferralScreening[];
	snapshotTakenAt: string | null;
	sharing: {
		/** The newest grant between her studio and this clinic. */
		status: ConsentStatus | 'none';
		/** When sharing ended; what was shared before stays, labelled with this date. */
		endedAt: string | null;
		/** A grant in force covers referral and screenings (what sending needs). */
		canSend: boolean;
		/** The clinic may read her live screening history now. */
		screeningsLive: boolean;
	};
	/** The moves the reader may make now (consent is checked again when she makes one). */
	actions: ReferralAction[];
}
