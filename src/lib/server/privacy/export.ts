import { recordAccess } from '../audit';
import { readClearance } from '../clearance/clearance';
import { getOwnRecord } from '../clients/service';
import { mayReadOwnRecord } from '../clients/policy';
import { getConsentOverview } from '../consents/service';
import { refuse, type Caller } from '../context';
import { and, asc, eq } from 'drizzle-orm';
import { db } from '../db';
import { documents as documentRows, referrals as referralRows, users } from '../db/schema';
import type { DocumentItem } from '../documents/service';
import { notFound } from '../http/problem';
import { plansForMe } from '../plans/service';
import { listClientReferrals } from '../referrals/for-client';
import { getOwnHomePractice, listOwnSelfChecks } from '../self-care/service';
import { listOwnAccess, type OwnAccessItem } from './access';
import { buildClientBundle, type FhirBundle } from './fhir';

// "Download my data" as one JSON document (GDPR Art. 15 and 20): everything Seamwell shows
// her about herself, read through the same services and policies as her own screens, so the
// export can never hold more than she may see. Each field is described in the README
// ("Your data as JSON"). The export itself is logged as client.exported.

export const EXPORT_FORMAT = 'seamwell.client-export';
export const EXPORT_VERSION = 1;

/** Her whole access list, walked page by page (it is hers alone, so it stays small). */
async function wholeAccessList(caller: Caller): Promise<OwnAccessItem[]> {
	const items: OwnAccessItem[] = [];
	let cursor: string | undefined;
	do {
		const page = await listOwnAccess(caller, { limit: 100, cursor });
		items.push(...page.items);
		cursor = page.nextCursor ?? undefined;
	} while (cursor);
	return items;
}

/**
 * The assessment documents the clinic shared with her studio (their description, not their
 * contents: the PDF stays behind the sign-in, and the export points at it).
 */
async function documentsSharedWithStudio(clientId: string): Promise<DocumentItem[]> {
	const rows = await db()
		.select({ document: documentRows, uploader: users.name })
		.from(documentRows)
		.innerJoin(referralRows, eq(referralRows.id, documentRows.referralId))
		.leftJoin(users, eq(users.id, documentRows.uploadedBy))
		.where(and(eq(referralRows.clientId, clientId), eq(documentRows.share, 'studio')))
		.orderBy(asc(documentRows.uploadedAt));
	return rows.map(({ document: d, uploader }) => ({
		id: d.id,
		name: d.fileName,
		share: d.share,
		size: d.sizeBytes,
		pages: d.pages,
		uploadedAt: d.uploadedAt.toISOString(),
		uploadedBy: uploader,
		summary: d.summary
	}));
}

/** Policy: the client herself (mayReadOwnRecord). Audit: client.exported. */
export async function exportOwnData(caller: Caller, now = new Date()) {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) {
		return refuse(caller, 'client.exported', notFound('You have no client record in Seamwell.'));
	}
	const record = await getOwnRecord(caller);
	const [consents, referrals, clearance, inClass, selfChecks, homePractice, documents] =
		await Promise.all([
			getConsentOverview(caller),
			listClientReferrals(caller, record.client.id),
			readClearance(caller, record.client.id),
			plansForMe(caller),
			listOwnSelfChecks(caller),
			getOwnHomePractice(caller),
			documentsSharedWithStudio(record.client.id)
		]);
	await recordAccess(db(), caller.access, {
		action: 'client.exported',
		outcome: 'success',
		target: { type: 'client', id: record.client.id },
		clientId: record.client.id
	});
	const accessLog = await wholeAccessList(caller);
	return {
		format: EXPORT_FORMAT,
		version: EXPORT_VERSION,
		exportedAt: now.toISOString(),
		client: record.client,
		screenings: record.history,
		consents,
		referrals,
		documents,
		clearance,
		inClass,
		selfChecks: { sharedWithStudio: selfChecks.shared, checks: selfChecks.checks },
		homePractice,
		accessLog
	};
}

export type OwnDataExport = Awaited<ReturnType<typeof exportOwnData>>;

/** The same export as a FHIR R4 Bundle (what FHIR has resources for). */
export function ownDataBundle(data: OwnDataExport, origin: string): FhirBundle {
	return buildClientBundle(
		{
			client: data.client,
			screenings: data.screenings.items,
			consents: data.consents.grants,
			referrals: data.referrals,
			selfChecks: data.selfChecks.checks,
			documents: data.documents
		},
		origin,
		new Date(data.exportedAt)
	);
}
