import { createHash, randomUUID } from 'node:crypto';
import { and, asc, eq, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { recordAccess, recordRefusal, type AuditAction } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import { documents, referrals, users } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { letterKey } from '../referrals/letter';
import { instructorRecipient, notifyAll } from '../referrals/notify';
import { deleteObject, getObject, putObject } from '../storage';
import { MAX_DOCUMENT_BYTES, MAX_DOCUMENT_PAGES } from './limits';
import { inspectPdf } from './pdf-check';
import {
	decideDocumentAccess,
	decideUpload,
	documentSide,
	mayDownloadLetter,
	mayEditDocument,
	mayListDocuments,
	UPLOAD_STATES
} from './policy';
import { cleanFileName, type DocumentPatch, type DocumentShare, type UploadInput } from './schemas';
import { stampPdf } from './stamp';

// Assessment documents and the referral letter. Every exported function asserts its rule from
// ./policy.ts first; consent is read fresh on every request. A refusal is logged in a
// transaction of its own (it survives the work's rollback) and then thrown.
//
// Storage and database cannot share a transaction, so an upload writes the object first and
// its row second: a failed row deletes the object, and the sweeper (./sweeper.ts) removes any
// object still without a row — whatever fails, no row ever points at a missing object.

type ReferralRow = typeof referrals.$inferSelect;
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

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

function storageUnavailable(cause: unknown): ProblemError {
	console.error('[documents] storage unavailable:', cause);
	return new ProblemError('storage-unavailable', {
		detail:
			'Document storage is unavailable, so nothing was saved. Please try again in a few minutes.'
	});
}

/** A referral anyone on either side may see; anything else is logged as refused (404). */
async function visibleReferral(
	caller: Caller,
	id: string,
	action: AuditAction
): Promise<ReferralRow> {
	const [row] = await db().select().from(referrals).where(eq(referrals.id, id));
	if (!row || !mayListDocuments(caller.actor, row)) {
		return refuse(caller, action, notFound(), { type: 'referral', id }, row?.clientId);
	}
	return row;
}

const pairOf = (row: ReferralRow) => ({
	clientId: row.clientId,
	studioId: row.studioId,
	clinicId: row.clinicId
});

async function documentsConsent(executor: Executor, row: ReferralRow) {
	return sharingState(executor, pairOf(row), ['documents']);
}

const sharingEndedProblem = (endedAt: Date | null) =>
	new ProblemError('forbidden', {
		detail: `The client's consent to share documents with your studio is not in force${
			endedAt ? ` (sharing ended on ${endedAt.toISOString().slice(0, 10)})` : ''
		}. Copies you downloaded before stay in your records.`
	});

const itemColumns = { document: documents, uploaderName: users.name, uploaderEmail: users.email };

function toItem(row: {
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

// ── Uploading ──────────────────────────────────────────────────────────────────────────

/**
 * Policy: decideUpload (a physiotherapist of the referral's clinic, referral accepted or
 * assessed) and the client's consent with `referral` in force. Audit: document.uploaded
 * (a refused file: document.uploaded, outcome failed). The file is checked by inspectPdf
 * before anything is kept.
 */
export async function uploadDocument(
	caller: Caller,
	referralId: string,
	input: UploadInput
): Promise<{ id: string }> {
	const row = await visibleReferral(caller, referralId, 'document.uploaded');
	const target = { type: 'referral', id: referralId };
	const decision = decideUpload(caller.actor, row);
	if (decision.kind === 'not-clinic') {
		return refuse(
			caller,
			'document.uploaded',
			new ProblemError('forbidden', {
				detail: 'Documents are added by the physiotherapists of the clinic.'
			}),
			target,
			row.clientId
		);
	}
	if (decision.kind === 'wrong-state') {
		return refuse(
			caller,
			'document.uploaded',
			new ProblemError('conflict', {
				detail: 'Documents can be added once your clinic has accepted the referral.'
			}),
			target,
			row.clientId
		);
	}
	if (decision.kind !== 'allowed') {
		return refuse(caller, 'document.uploaded', notFound(), target, row.clientId);
	}
	if (!(await sharingState(db(), pairOf(row), ['referral'])).covered) {
		return refuse(
			caller,
			'document.uploaded',
			new ProblemError('consent-required', {
				detail:
					"The client's consent to share with your clinic is not in force, so no documents can be added."
			}),
			target,
			row.clientId
		);
	}

	const inspection = await inspectPdf(input.bytes);
	if (!inspection.ok) {
		await recordRefusal(caller.access, {
			action: 'document.uploaded',
			outcome: 'failed',
			target,
			clientId: row.clientId
		});
		throw new ProblemError('validation-failed', {
			detail: `${inspection.message} Nothing was saved.`,
			errors: [{ pointer: '/file', message: inspection.message }],
			code: inspection.code
		});
	}

	const id = randomUUID();
	const key = documentKey(referralId, id);
	await storeVerified(key, input.bytes, inspection.sha256);
	try {
		await db().transaction(async (tx) => {
			// The referral may have moved, or consent been withdrawn, while the file travelled.
			const [current] = await tx
				.select({ state: referrals.state })
				.from(referrals)
				.where(eq(referrals.id, referralId))
				.for('share');
			if (!current || !UPLOAD_STATES.includes(current.state)) {
				throw new ProblemError('conflict', {
					detail: 'The referral changed while the file was uploading. Nothing was saved.'
				});
			}
			const consent = await sharingState(tx, pairOf(row), ['referral'], new Date(), {
				lock: true
			});
			if (!consent.covered) {
				throw new ProblemError('consent-required', {
					detail:
						"The client's consent to share with your clinic ended while the file was uploading. Nothing was saved."
				});
			}
			await tx.insert(documents).values({
				id,
				referralId,
				storageKey: key,
				fileName: cleanFileName(input.fileName),
				share: input.share,
				summary: input.summary,
				sizeBytes: input.bytes.length,
				pages: inspection.pages,
				sha256: inspection.sha256,
				uploadedBy: caller.actor.userId
			});
			await recordAccess(tx, caller.access, {
				action: 'document.uploaded',
				outcome: 'success',
				target: { type: 'document', id },
				clientId: row.clientId
			});
			if (input.share === 'studio') await tellStudio(tx, row);
		});
	} catch (error) {
		await deleteObject(key).catch((cause: unknown) => {
			// The sweeper removes it later; the row was never written.
			console.error(`[documents] could not delete ${key} after a failed upload:`, cause);
		});
		if (error instanceof ProblemError) {
			await recordRefusal(caller.access, {
				action: 'document.uploaded',
				target,
				clientId: row.clientId
			});
		}
		throw error;
	}
	return { id };
}

/**
 * Writes the file as one Buffer (s3rver does not handle the SDK's streamed, checksummed
 * uploads) and reads it back to check its SHA-256: a copy that did not arrive intact is
 * deleted and the upload refused.
 */
async function storeVerified(key: string, bytes: Uint8Array, expected: string): Promise<void> {
	let stored: Buffer;
	try {
		await putObject(key, Buffer.from(bytes), 'application/pdf');
		stored = await getObject(key);
	} catch (cause) {
		await deleteObject(key).catch(() => undefined);
		throw storageUnavailable(cause);
	}
	if (sha256(stored) !== expected) {
		await deleteObject(key).catch(() => undefined);
		throw storageUnavailable(new Error(`stored copy of ${key} differs from the upload`));
	}
}

/** Mail the instructor who referred, only while the client lets documents reach the studio. */
async function tellStudio(tx: Executor, row: ReferralRow): Promise<void> {
	if (!(await documentsConsent(tx, row)).covered) return;
	await notifyAll(tx, await instructorRecipient(tx, row.createdBy), 'document.shared', row.id);
}

// ── Listing ────────────────────────────────────────────────────────────────────────────

const listCursor = z.object({ t: z.iso.datetime(), id: z.uuid() });

/** The clinic sees all of a referral's documents; the studio only shareable ones. */
function visibleTo(side: 'clinic' | 'studio', referralId: string): SQL {
	return side === 'clinic'
		? eq(documents.referralId, referralId)
		: and(eq(documents.referralId, referralId), eq(documents.share, 'studio'))!;
}

/**
 * Policy: mayListDocuments (either side of the referral); the studio sees shareable documents
 * only, and only while consent with `documents` is in force (else 403, logged). Audit:
 * referral.read — the list is part of the referral's record.
 */
export async function listDocuments(
	caller: Caller,
	referralId: string,
	query: { limit: number; cursor?: string }
): Promise<Page<DocumentItem>> {
	const row = await visibleReferral(caller, referralId, 'referral.read');
	const side = documentSide(caller.actor, row)!;
	if (side === 'studio') {
		const consent = await documentsConsent(db(), row);
		if (!consent.covered) {
			return refuse(
				caller,
				'referral.read',
				sharingEndedProblem(consent.endedAt),
				{ type: 'referral', id: referralId },
				row.clientId
			);
		}
	}
	const after = decodeCursor(query.cursor, listCursor);
	const where: SQL[] = [visibleTo(side, referralId)];
	if (after) {
		where.push(
			sql`(${documents.uploadedAt}, ${documents.id}) > (${after.t}::timestamptz, ${after.id}::uuid)`
		);
	}
	return db().transaction(async (tx) => {
		const rows = await tx
			.select(itemColumns)
			.from(documents)
			.leftJoin(users, eq(users.id, documents.uploadedBy))
			.where(and(...where))
			.orderBy(asc(documents.uploadedAt), asc(documents.id))
			.limit(query.limit + 1);
		const page = toPage(rows, query.limit, (last) => ({
			t: last.document.uploadedAt.toISOString(),
			id: last.document.id
		}));
		await recordAccess(tx, caller.access, {
			action: 'referral.read',
			outcome: 'success',
			target: { type: 'referral', id: referralId },
			clientId: row.clientId
		});
		return { items: page.items.map(toItem), nextCursor: page.nextCursor };
	});
}

export interface DocumentPanel {
	side: 'clinic' | 'studio';
	/** She may add documents now (clinic, accepted or assessed, consent in force). */
	canUpload: boolean;
	/** Why she cannot, in words, when she is on the clinic's side. */
	uploadNote: string | null;
	canEdit: boolean;
	/** Whether documents reach the studio now, and when that ended. */
	studioSharing: { covered: boolean; endedAt: string | null };
	items: DocumentItem[];
	limits: { maxBytes: number; maxPages: number };
}

/**
 * Policy: mayListDocuments, with the same filter as listDocuments (the studio: shareable ones
 * while consent with `documents` lasts; after it ends, none and the date it ended). For the
 * referral page, whose load records referral.read through getReferral; no row of its own.
 */
export async function getDocumentPanel(caller: Caller, referralId: string): Promise<DocumentPanel> {
	const row = await visibleReferral(caller, referralId, 'referral.read');
	const side = documentSide(caller.actor, row)!;
	const studioConsent = await documentsConsent(db(), row);
	const referralConsent = await sharingState(db(), pairOf(row), ['referral']);
	const visible = side === 'clinic' || studioConsent.covered;
	const rows = visible
		? await db()
				.select(itemColumns)
				.from(documents)
				.leftJoin(users, eq(users.id, documents.uploadedBy))
				.where(visibleTo(side, referralId))
				.orderBy(asc(documents.uploadedAt), asc(documents.id))
		: [];
	const decision = decideUpload(caller.actor, row);
	let uploadNote: string | null = null;
	if (side === 'clinic' && decision.kind === 'wrong-state') {
		uploadNote = 'Documents can be added once your clinic has accepted the referral.';
	} else if (side === 'clinic' && !referralConsent.covered) {
		uploadNote = "The client's consent to share with your clinic is not in force.";
	}
	return {
		side,
		canUpload: decision.kind === 'allowed' && referralConsent.covered,
		uploadNote,
		canEdit: mayEditDocument(caller.actor, row),
		studioSharing: {
			covered: studioConsent.covered,
			endedAt: studioConsent.endedAt?.toISOString() ?? null
		},
		items: rows.map(toItem),
		limits: { maxBytes: MAX_DOCUMENT_BYTES, maxPages: MAX_DOCUMENT_PAGES }
	};
}

// ── One document ───────────────────────────────────────────────────────────────────────

async function documentWithReferral(id: string) {
	const [found] = await db()
		.select({ document: documents, referral: referrals })
		.from(documents)
		.innerJoin(referrals, eq(referrals.id, documents.referralId))
		.where(eq(documents.id, id));
	return found ?? null;
}

/**
 * Policy: mayEditDocument (a physiotherapist of the clinic that holds it; the studio gets 403
 * for a shareable document it may see, 404 otherwise). Audit: document.updated. Marking a
 * document shareable tells the instructor, as an upload would.
 */
export async function updateDocument(
	caller: Caller,
	id: string,
	patch: DocumentPatch
): Promise<DocumentItem> {
	const found = await documentWithReferral(id);
	const target = { type: 'document', id };
	if (!found) return refuse(caller, 'document.updated', notFound(), target);
	const { document, referral } = found;
	if (!mayEditDocument(caller.actor, referral)) {
		const consent = await documentsConsent(db(), referral);
		const access = decideDocumentAccess(caller.actor, referral, document, consent.covered);
		return refuse(
			caller,
			'document.updated',
			access.kind === 'allowed'
				? new ProblemError('forbidden', {
						detail: 'Only the physiotherapists of the clinic change a document.'
					})
				: notFound(),
			target,
			referral.clientId
		);
	}
	return db().transaction(async (tx) => {
		const changes: Partial<typeof documents.$inferInsert> = { updatedAt: new Date() };
		if (patch.share !== undefined) changes.share = patch.share;
		if (patch.summary !== undefined) changes.summary = patch.summary;
		const [before] = await tx
			.select({ share: documents.share })
			.from(documents)
			.where(eq(documents.id, id))
			.for('update');
		if (!before) throw notFound();
		await tx.update(documents).set(changes).where(eq(documents.id, id));
		await recordAccess(tx, caller.access, {
			action: 'document.updated',
			outcome: 'success',
			target,
			clientId: referral.clientId
		});
		if (before.share === 'clinic' && patch.share === 'studio') await tellStudio(tx, referral);
		const [updated] = await tx
			.select(itemColumns)
			.from(documents)
			.leftJoin(users, eq(users.id, documents.uploadedBy))
			.where(eq(documents.id, id));
		return toItem(updated!);
	});
}

/** The viewer's organisation on this referral, for the stamp. */
function organisationName(caller: Caller, organisationId: string): string | null {
	return (
		caller.actor.memberships.find((m) => m.organisationId === organisationId)?.organisationName ??
		null
	);
}

/**
 * Policy: decideDocumentAccess (the clinic; the studio for a shareable document while consent
 * with `documents` lasts — 403 after it ends, 404 for a clinic-only one). Audit:
 * document.downloaded. The copy is stamped on every page with her name and the time; the
 * stored original is checked against its SHA-256 and never changed.
 */
export async function downloadDocument(caller: Caller, id: string): Promise<DownloadedFile> {
	const found = await documentWithReferral(id);
	const target = { type: 'document', id };
	if (!found) return refuse(caller, 'document.downloaded', notFound(), target);
	const { document, referral } = found;
	const consent = await documentsConsent(db(), referral);
	const access = decideDocumentAccess(caller.actor, referral, document, consent.covered);
	if (access.kind !== 'allowed') {
		return refuse(
			caller,
			'document.downloaded',
			access.kind === 'sharing-ended' ? sharingEndedProblem(consent.endedAt) : notFound(),
			target,
			referral.clientId
		);
	}
	let original: Buffer;
	try {
		original = await getObject(document.storageKey);
	} catch (cause) {
		throw storageUnavailable(cause);
	}
	if (sha256(original) !== document.sha256) {
		throw new Error(`stored document ${id} does not match its SHA-256`);
	}
	const at = new Date();
	const bytes = await stampPdf(original, {
		viewerName: caller.actor.name ?? caller.actor.email,
		organisation: organisationName(
			caller,
			access.side === 'clinic' ? referral.clinicId : referral.studioId
		),
		at
	});
	await db().transaction((tx) =>
		recordAccess(tx, caller.access, {
			action: 'document.downloaded',
			outcome: 'success',
			target,
			clientId: referral.clientId
		})
	);
	return { bytes, fileName: document.fileName };
}

// ── The referral letter ────────────────────────────────────────────────────────────────

/**
 * Policy: mayDownloadLetter (either side, once the referral was sent; the clinic keeps it
 * after sharing ends). Audit: letter.downloaded. The letter is the one stored when the
 * referral was sent, answered as stored: it is never made again.
 */
export async function downloadLetter(caller: Caller, referralId: string): Promise<DownloadedFile> {
	const row = await visibleReferral(caller, referralId, 'letter.downloaded');
	const target = { type: 'referral', id: referralId };
	if (!mayDownloadLetter(caller.actor, row)) {
		return refuse(
			caller,
			'letter.downloaded',
			notFound('This referral has not been sent, so it has no letter yet.'),
			target,
			row.clientId
		);
	}
	let bytes: Buffer;
	try {
		bytes = await getObject(letterKey(referralId));
	} catch (cause) {
		if ((cause as { name?: string }).name === 'NoSuchKey') {
			return refuse(
				caller,
				'letter.downloaded',
				notFound('No letter was stored for this referral.'),
				target,
				row.clientId
			);
		}
		throw storageUnavailable(cause);
	}
	await db().transaction((tx) =>
		recordAccess(tx, caller.access, {
			action: 'letter.downloaded',
			outcome: 'success',
			target,
			clientId: row.clientId
		})
	);
	const day = (row.sentAt ?? row.createdAt).toISOString().slice(0, 10);
	return { bytes, fileName: `referral-letter-${day}.pdf` };
}
