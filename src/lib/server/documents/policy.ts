import type { ReferralState } from '../../domain/referral';
import type { Actor } from '../actor';
import { instructorStudioIds, physioClinicIds } from '../scope';

// Who may add, see, change and download a referral's assessment documents and its letter.
// Pure functions of the actor, the referral, the document and (where sharing flows from the
// clinic to the studio) whether the client's consent with `documents` is in force right now —
// the service reads that fresh and passes it in. Where a refusal as 403 would confirm that a
// document exists (another clinic; a clinic-only document and the studio), the answer is 404.

export interface DocumentReferral {
	studioId: string;
	clinicId: string;
	state: ReferralState;
	sentAt: Date | null;
	/** Set when the studio erased the client's record: only the clinic's side remains. */
	studioErasedAt?: Date | null;
}

export interface DocumentScope {
	share: 'clinic' | 'studio';
}

/** Documents are added while the clinic is working on the referral. */
export const UPLOAD_STATES: readonly ReferralState[] = ['accepted', 'assessed'];

/**
 * Which side of the referral she stands on: `clinic` — a physiotherapist of the clinic it was
 * sent to; `studio` — an instructor of the referring studio; null — neither (or a clinic and a
 * referral never sent to it). Someone on both sides acts as the clinic.
 */
export function documentSide(actor: Actor, referral: DocumentReferral): 'clinic' | 'studio' | null {
	const received = referral.state !== 'draft' && referral.sentAt !== null;
	if (physioClinicIds(actor).includes(referral.clinicId) && received) return 'clinic';
	if (!referral.studioErasedAt && instructorStudioIds(actor).includes(referral.studioId)) {
		return 'studio';
	}
	return null;
}

/** Listing a referral's documents: either side (the studio sees only shareable ones). */
export function mayListDocuments(actor: Actor, referral: DocumentReferral): boolean {
	return documentSide(actor, referral) !== null;
}

export type UploadDecision =
	| { kind: 'allowed' }
	/** Not on the referral at all: 404. */
	| { kind: 'hidden' }
	/** The studio's instructors see the referral but do not add documents: 403. */
	| { kind: 'not-clinic' }
	/** Not accepted (yet), or past the clinic's work on it: 409. */
	| { kind: 'wrong-state' };

/**
 * Adding a document: a physiotherapist of the referral's clinic, on a referral the clinic has
 * accepted (or already marked assessed). The client's consent in force is checked apart, by
 * the service, because it is read fresh inside the work.
 */
export function decideUpload(actor: Actor, referral: DocumentReferral): UploadDecision {
	const side = documentSide(actor, referral);
	if (side === null) return { kind: 'hidden' };
	if (side !== 'clinic') return { kind: 'not-clinic' };
	if (!UPLOAD_STATES.includes(referral.state)) return { kind: 'wrong-state' };
	return { kind: 'allowed' };
}

/** Changing a document's sharing or summary: a physiotherapist of the clinic that holds it. */
export function mayEditDocument(actor: Actor, referral: DocumentReferral): boolean {
	return documentSide(actor, referral) === 'clinic';
}

export type DocumentAccess =
	| { kind: 'allowed'; side: 'clinic' | 'studio' }
	/** The caller may not know the document exists: 404. */
	| { kind: 'hidden' }
	/** The studio knew of this shareable document, but the client's consent no longer covers it: 403. */
	| { kind: 'sharing-ended' };

/**
 * Seeing and downloading one document: the clinic, always (its own clinical record); the
 * studio, only a document marked shareable and only while consent with `documents` lasts.
 */
export function decideDocumentAccess(
	actor: Actor,
	referral: DocumentReferral,
	document: DocumentScope,
	documentsConsented: boolean
): DocumentAccess {
	const side = documentSide(actor, referral);
	if (side === 'clinic') return { kind: 'allowed', side };
	if (side !== 'studio' || document.share !== 'studio') return { kind: 'hidden' };
	return documentsConsented ? { kind: 'allowed', side } : { kind: 'sharing-ended' };
}

/**
 * The referral letter: either side, once the referral was sent (it is made at that moment).
 * The clinic keeps it after sharing ends, like the rest of what it received.
 */
export function mayDownloadLetter(actor: Actor, referral: DocumentReferral): boolean {
	return documentSide(actor, referral) !== null && referral.sentAt !== null;
}
