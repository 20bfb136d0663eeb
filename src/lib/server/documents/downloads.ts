import { eq } from 'drizzle-orm';
import { recordAccess } from '../audit';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { documents, referrals, users } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { letterKey } from '../referrals/letter';
import { getObject } from '../storage';
import { decideDocumentAccess, mayDownloadLetter, mayEditDocument } from './policy';
import { type DocumentPatch } from './schemas';
import { stampPdf } from './stamp';
import {
	type DocumentItem,
	type DownloadedFile,
	documentsConsent,
	itemColumns,
	sha256,
	sharingEndedProblem,
	storageUnavailable,
	toItem,
	visibleReferral
} from './shared';
import { tellStudio } from './upload';

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
