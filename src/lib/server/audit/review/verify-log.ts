import type { Caller } from '../../context';
import { db } from '../../db';
import { recordAccess } from '../writer';
import { verifyAnchored } from '../verify';
import { s3AnchorStore } from '../../storage/anchors';
import { asReviewer, assertReviewer } from './events';

export interface VerifyAnswer {
	ok: boolean;
	checkedRows: number;
	headRowId: number | null;
	headHash: string | null;
	anchoredHeads: number;
	/** When the newest anchored head was written. */
	anchoredAt: string | null;
	rowsPerSecond: number;
	firstBrokenRowId?: number;
	detail?: string;
}

/**
 * Policy: admin of the active organisation (the chain is one for all; the answer names rows
 * by number only). Audit: audit.verified. Anchors the head, then checks the chain and every
 * anchored head.
 */
export async function verifyAccessLog(caller: Caller): Promise<VerifyAnswer> {
	const reviewer = await assertReviewer(caller, 'audit.verified');
	const report = await verifyAnchored(db(), s3AnchorStore);
	await db().transaction((tx) =>
		recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.verified',
			outcome: 'success',
			target: { type: 'organisation', id: reviewer.organisationId }
		})
	);
	return {
		ok: report.intact,
		checkedRows: report.checked,
		headRowId: report.headRowId,
		headHash: report.headHash,
		anchoredHeads: report.anchoredHeads,
		anchoredAt: report.latestAnchor?.anchoredAt ?? null,
		rowsPerSecond: report.rowsPerSecond,
		...(report.firstBroken
			? { firstBrokenRowId: report.firstBroken.rowId, detail: report.firstBroken.detail }
			: {})
	};
}
