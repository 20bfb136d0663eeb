import { and, asc, desc, eq, sql, type SQL } from 'drizzle-orm';
import { z } from 'zod';
import { recordAccess } from '../audit';
import { sharingState } from '../consents/grants';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { documents, users } from '../db/schema';
import { decodeCursor, toPage, type Page } from '../http/schemas';
import { MAX_DOCUMENT_BYTES, MAX_DOCUMENT_PAGES } from './limits';
import { decideUpload, documentSide, mayEditDocument } from './policy';
import {
	type DocumentItem,
	documentsConsent,
	itemColumns,
	pairOf,
	sharingEndedProblem,
	toItem,
	visibleReferral
} from './shared';

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
				// Newest first on the page, like every list a person reads.
				.orderBy(desc(documents.uploadedAt), desc(documents.id))
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
