import { eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { RED_FLAG_LABELS } from '../../../domain/red-flags';
import type { Executor } from '../../db';
import { consents, organisations, referralSnapshots, referrals, users } from '../../db/schema';
import { renderReferralLetter } from './render';
import { putObject } from '../../storage';
import type { SnapshotClient } from '../snapshot';

// The referral letter, made once when a referral is sent, from the copy the clinic received
// (so the letter and the shared record agree), and kept in object storage. The send's own
// transaction calls this after its policy and consent checks; it asserts nothing itself.

export const letterKey = (referralId: string) => `referral-letters/${referralId}.pdf`;

function stageWords(
	client: SnapshotClient,
	weeks: { postpartum: number | null; gestation: number | null }
) {
	if (client.stage === 'postpartum') {
		return weeks.postpartum === null ? 'Postpartum' : `${weeks.postpartum} weeks postpartum`;
	}
	return weeks.gestation === null ? 'Pregnant' : `${weeks.gestation} weeks pregnant`;
}

/** Renders the sent referral's letter and stores it; returns its storage key. */
export async function generateReferralLetter(
	executor: Executor,
	referralId: string
): Promise<string> {
	const studio = alias(organisations, 'letter_studio');
	const clinic = alias(organisations, 'letter_clinic');
	const creator = alias(users, 'letter_creator');
	const physio = alias(users, 'letter_physio');
	const [row] = await executor
		.select({
			referral: referrals,
			snapshot: referralSnapshots,
			consent: consents,
			studioName: studio.name,
			clinicName: clinic.name,
			creatorName: creator.name,
			creatorEmail: creator.email,
			physioName: physio.name
		})
		.from(referrals)
		.innerJoin(referralSnapshots, eq(referralSnapshots.referralId, referrals.id))
		.innerJoin(consents, eq(consents.id, referrals.consentId))
		.innerJoin(studio, eq(studio.id, referrals.studioId))
		.innerJoin(clinic, eq(clinic.id, referrals.clinicId))
		.leftJoin(creator, eq(creator.id, referrals.createdBy))
		.leftJoin(physio, eq(physio.id, referrals.physioId))
		.where(eq(referrals.id, referralId));
	if (!row)
		throw new Error(`referral ${referralId} has no snapshot or consent to write a letter from`);
	const { referral, snapshot, consent } = row;
	const latest = snapshot.screenings.at(-1);
	const pdf = await renderReferralLetter({
		referralId,
		createdAt: referral.createdAt,
		sentAt: referral.sentAt,
		client: {
			name: snapshot.client.name,
			yearOfBirth: snapshot.client.birthYear,
			stage: stageWords(snapshot.client, {
				postpartum: latest?.weeksPostpartum ?? null,
				gestation: latest?.weeksOfGestation ?? null
			})
		},
		referrer: {
			name: row.creatorName ?? row.creatorEmail ?? 'An instructor',
			studio: row.studioName
		},
		clinic: { name: row.clinicName, physio: row.physioName },
		reason: referral.reason,
		urgency: referral.urgency,
		redFlags: referral.redFlags.map((flag) => RED_FLAG_LABELS[flag]),
		screenings: snapshot.screenings.map((s) => ({
			takenAt: s.takenAt,
			sites: s.sites,
			outcome: s.outcome
		})),
		consent: { id: consent.id, givenAt: consent.startsAt, scopes: consent.scopes },
		generatedAt: snapshot.takenAt
	});
	const key = letterKey(referralId);
	await putObject(key, Buffer.from(pdf), 'application/pdf');
	return key;
}
