import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { recordAccess, recordRefusal } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db, type Executor } from '../db';
import { documents, referrals } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { instructorRecipient, notifyAll } from '../referrals/notify';
import { deleteObject, getObject, putObject } from '../storage';
import { inspectPdf } from './pdf-check';
import { decideUpload, UPLOAD_STATES } from './policy';
import { cleanFileName, type UploadInput } from './schemas';
import {
	type ReferralRow,
	documentKey,
	documentsConsent,
	pairOf,
	sha256,
	storageUnavailable,
	visibleReferral
} from './shared';

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
export async function tellStudio(tx: Executor, row: ReferralRow): Promise<void> {
	if (!(await documentsConsent(tx, row)).covered) return;
	await notifyAll(tx, await instructorRecipient(tx, row.createdBy), 'document.shared', row.id);
}
