// Consent to share: what each scope lets through, which way it flows, and whether a grant is
// in force at a given moment. Pure; the server reads grants fresh on every request and asks
// these functions, and the pages use the same words.

/** The scopes a client can grant for sharing between her studio and one clinic. */
export const SHARE_SCOPES = ['referral', 'screenings', 'clearance', 'documents'] as const;
export type ShareScope = (typeof SHARE_SCOPES)[number];

export type ShareDirection = 'studio_to_clinic' | 'clinic_to_studio';

/** Which way each scope lets data flow. */
export const SCOPE_DIRECTION: Record<ShareScope, ShareDirection> = {
	referral: 'studio_to_clinic',
	screenings: 'studio_to_clinic',
	clearance: 'clinic_to_studio',
	documents: 'clinic_to_studio'
};

/** Plain words for the client's consent page: what the scope lets the other side see. */
export const SCOPE_MEANING: Record<ShareScope, { title: string; text: string }> = {
	referral: {
		title: 'Referral',
		text: 'Your instructor may send the clinic a referral: why she refers you, how soon, and the warning signs she noted.'
	},
	screenings: {
		title: 'Screening history',
		text: 'The clinic may see the checks of your tummy muscles your studio has recorded, and new ones while this consent lasts.'
	},
	clearance: {
		title: 'Clearance',
		text: 'The clinic may tell your studio which kinds of movement you are cleared for, which need changes and which should wait.'
	},
	documents: {
		title: 'Documents',
		text: 'Your physiotherapist may share documents she marks for your studio, such as an assessment summary.'
	}
};

export const DIRECTION_WORDS: Record<ShareDirection, string> = {
	studio_to_clinic: 'from your studio to the clinic',
	clinic_to_studio: 'from the clinic to your studio'
};

/** Sending a referral needs both: the clinic receives the referral and the history it rests on. */
export const SEND_SCOPES: readonly ShareScope[] = ['referral', 'screenings'];

export function isShareScope(value: string): value is ShareScope {
	return (SHARE_SCOPES as readonly string[]).includes(value);
}

/** The scopes in the list's own order, each once. */
export function normaliseScopes(scopes: readonly ShareScope[]): ShareScope[] {
	return SHARE_SCOPES.filter((scope) => scopes.includes(scope));
}

export interface ConsentGrant {
	scopes: readonly string[];
	startsAt: Date;
	endsAt: Date | null;
	withdrawnAt: Date | null;
}

export type ConsentStatus = 'active' | 'not_started' | 'ended' | 'withdrawn';

/**
 * Where a grant stands at `now`. Withdrawal wins over everything; the end is exclusive (a
 * grant ending at noon no longer holds at noon); the start is inclusive.
 */
export function consentStatus(grant: ConsentGrant, now: Date): ConsentStatus {
	if (grant.withdrawnAt !== null && grant.withdrawnAt.getTime() <= now.getTime()) {
		return 'withdrawn';
	}
	if (grant.startsAt.getTime() > now.getTime()) return 'not_started';
	if (grant.endsAt !== null && grant.endsAt.getTime() <= now.getTime()) return 'ended';
	return 'active';
}

/** True when the grant is in force at `now` and covers every scope asked for. */
export function consentCovers(
	grant: ConsentGrant,
	scopes: readonly ShareScope[],
	now: Date
): boolean {
	return consentStatus(grant, now) === 'active' && scopes.every((s) => grant.scopes.includes(s));
}

/** Of several grants, whether any one alone covers the scopes at `now`. */
export function anyConsentCovers(
	grants: readonly ConsentGrant[],
	scopes: readonly ShareScope[],
	now: Date
): boolean {
	return grants.some((grant) => consentCovers(grant, scopes, now));
}

/**
 * When sharing under a grant stopped: the withdrawal or the end, whichever came first, or
 * null while it still holds (or has not begun). Records shared before it are kept, labelled
 * with this date.
 */
export function sharingEndedAt(grant: ConsentGrant, now: Date): Date | null {
	const status = consentStatus(grant, now);
	if (status === 'withdrawn') {
		if (grant.endsAt !== null && grant.endsAt.getTime() < grant.withdrawnAt!.getTime()) {
			return grant.endsAt;
		}
		return grant.withdrawnAt;
	}
	if (status === 'ended') return grant.endsAt;
	return null;
}
