import { createHash } from 'node:crypto';
import { type AuditAction } from '../audit';
import { sharingState } from '../consents/grants';
import type { Caller } from '../context';
import type { Executor } from '../db';
import { documents, users } from '../db/schema';
import { ProblemError } from '../http/problem';
import { mayListDocuments } from './policy';
import { visibleReferral as visibleByRule, type ReferralRow } from '../referrals/shared';
import { type DocumentShare } from './schemas';

// Assessment documents and the referral letter. Every exported function asserts its rule from
// ./policy.ts first; consent is read fresh on every request. A refusal is logged in a
// transaction of its own (it survives the work's rollback) and then thrown.
//
// Storage and database cannot share a transaction, so an upload writes the object first and
// its row second: a failed row deletes the object, and the sweeper (./sweeper.ts) removes any
// object still without a row — whatever fails, no row ever points at a missing object.

export type { ReferralRow };
type DocumentRow = typeof documents.$inferSelect;

export interface DocumentItem {
	id: string;
	name: string;
	share: DocumentShare;
	size: number;
	pages: number;
	uploadedAt: string;
	/** The uploader's name (or address), null once her account is gone. */
	uploadedBy: string | null;
	/** The physiotherapist's plain-language summary for the instructor. */
	summary: string | null;
}

export interface DownloadedFile {
	bytes: Uint8Array;
	fileName: string;
}

/** Where a document's object lives: chosen here, never from anything the uploader sent. */
export const documentKey = (referralId: string, documentId: string) =>
	`documents/${referralId}/${documentId}.pdf`;

export const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

export function storageUnavailable(cause: unknown): ProblemError {
	console.error('[documents] storage unavailable:', cause);
	return new ProblemError('storage-unavailable', {
		detail:
			'Document storage is unavailable, so nothing was saved. Please try again in a few minutes.'
	});
}

/** A referral whose documents the caller may see (either side); else a logged 404. */
export const visibleReferral = (caller: Caller, id: string, action: AuditAction) =>
	visibleByRule(caller, id, action, mayListDocuments);

export const pairOf = (row: ReferralRow) => ({
	clientId: row.clientId,
	studioId: row.studioId,
	clinicId: row.clinicId
});

export async function documentsConsent(executor: Executor, row: ReferralRow) {
	return sharingState(executor, pairOf(row), ['documents']);
}

export const sharingEndedProblem = (endedAt: Date | null) =>
	new ProblemError('forbidden', {
		detail: `The client's consent to share documents with your studio is not in force${
			endedAt ? ` (sharing ended on ${endedAt.toISOString().slice(0, 10)})` : ''
		}. Copies you downloaded before stay in your records.`
	});

export const itemColumns = {
	document: documents,
	uploaderName: users.name,
	uploaderEmail: users.email
};

export function toItem(row: {
	document: DocumentRow;
	uploaderName: string | null;
	uploaderEmail: string | null;
}): DocumentItem {
	const d = row.document;
	return {
		id: d.id,
		name: d.fileName,
		share: d.share,
		size: d.sizeBytes,
		pages: d.pages,
		uploadedAt: d.uploadedAt.toISOString(),
		uploadedBy: row.uploaderName ?? row.uploaderEmail,
		summary: d.summary
	};
}
