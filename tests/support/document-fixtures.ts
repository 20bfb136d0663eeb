import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { db } from '../../src/lib/server/db';
import { documents } from '../../src/lib/server/db/schema';
import { uploadDocument } from '../../src/lib/server/documents/service';
import { listObjects } from '../../src/lib/server/storage';
import {
	addConsent,
	addReferral,
	makeCast,
	makeClient,
	makeMember,
	makeOrg,
	type ClientPerson,
	type Org,
	type Person
} from './referral-fixtures';

// The people and records the assessment-document tests share (invented): a studio and a
// clinic with their instructor and physiotherapist, another clinic's physiotherapist and
// another studio's instructor, and a consenting client's referral.

export const MB = 1024 * 1024;
export const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

export interface DocumentCast {
	studio: Org;
	clinic: Org;
	instructor: Person;
	physio: Person;
	otherPhysio: Person;
	otherStudioInstructor: Person;
}

export async function documentCast(): Promise<DocumentCast> {
	const { studio, clinic, instructor, physio, otherPhysio } = await makeCast();
	const otherStudioInstructor = await makeMember(
		await makeOrg('studio', 'other studio'),
		'instructor'
	);
	return { studio, clinic, instructor, physio, otherPhysio, otherStudioInstructor };
}

export interface ReferralSetup {
	client: ClientPerson;
	referralId: string;
	consentId: string;
}

/** A client who consents to everything, and her referral, accepted by the clinic. */
export async function acceptedReferral(
	{ studio, clinic, instructor, physio }: DocumentCast,
	state: 'accepted' | 'sent' = 'accepted'
): Promise<ReferralSetup> {
	const client = await makeClient(studio);
	const consentId = await addConsent(client, studio, clinic);
	const referralId = await addReferral({
		clientId: client.clientId,
		studio,
		clinic,
		createdBy: instructor.userId,
		physioId: physio.userId,
		state
	});
	return { client, referralId, consentId };
}

export const upload = (
	caller: Person,
	referralId: string,
	bytes: Uint8Array,
	options: { fileName?: string; share?: 'clinic' | 'studio'; summary?: string | null } = {}
) =>
	uploadDocument(caller.caller, referralId, {
		bytes,
		fileName: options.fileName ?? 'assessment.pdf',
		share: options.share ?? 'clinic',
		summary: options.summary ?? null
	});

/** What the referral left behind: its rows and its stored objects. */
export async function stored(referralId: string) {
	const rows = await db().select().from(documents).where(eq(documents.referralId, referralId));
	const objects = await listObjects(`documents/${referralId}/`);
	return { rows: rows.length, objects: objects.length };
}
