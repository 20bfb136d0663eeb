import { and, eq } from 'drizzle-orm';
import type { Transaction } from '../db';
import {
	clients,
	consentEvents,
	consents,
	referralEvents,
	referrals,
	referralSnapshots,
	screenings
} from '../db/schema';
import { generateReferralLetter } from '../referrals/letter';
import { snapshotClient, snapshotScreenings } from '../referrals/snapshot';
import { seedDemoDocuments } from './documents';

// Demo referrals in the three consent states the authorization matrix checks, all from
// Linden Row Studio to Fernbank Pelvic Health (invented people, invented reasons):
//   consent active    — Bea Sorensen: sent, named to physio@clinic.example;
//   consent withdrawn — Clara Nwosu: was sent, then withdrawn with her consent;
//   no consent        — Ines Farrow: a draft;
//   consent active    — Maya Okonjo: accepted by physio@clinic.example, with one document
//                       shareable with the studio and one clinic-only (./documents.ts).
// Every referral that was sent has its letter stored, as sending stores it.
// Hana Lindqvist (client@client.example) is left without any, for the browser tests' own loop.

const DAY_MS = 86_400_000;

export async function seedDemoReferrals(
	tx: Transaction,
	orgIds: { studio: string; clinic: string },
	userIdsByEmail: Record<string, string>
): Promise<void> {
	const instructor = userIdsByEmail['instructor@studio.example'] ?? null;
	const physio = userIdsByEmail['physio@clinic.example'] ?? null;
	const now = Date.now();
	const byName = async (name: string) => {
		const [row] = await tx
			.select()
			.from(clients)
			.where(and(eq(clients.name, name), eq(clients.organisationId, orgIds.studio)));
		return row ?? null;
	};

	const plan = [
		{ name: 'Bea Sorensen', consent: 'active', state: 'sent' },
		{ name: 'Clara Nwosu', consent: 'withdrawn', state: 'withdrawn' },
		{ name: 'Ines Farrow', consent: 'none', state: 'draft' },
		{ name: 'Maya Okonjo', consent: 'active', state: 'accepted' }
	] as const;

	for (const step of plan) {
		const client = await byName(step.name);
		if (!client) continue;
		const sentAt = new Date(now - 6 * DAY_MS);
		let consentId: string | null = null;
		if (step.consent !== 'none') {
			const withdrawnAt = step.consent === 'withdrawn' ? new Date(now - 2 * DAY_MS) : null;
			const [grant] = await tx
				.insert(consents)
				.values({
					clientId: client.id,
					studioId: orgIds.studio,
					clinicId: orgIds.clinic,
					scopes: ['referral', 'screenings', 'clearance', 'documents'],
					startsAt: new Date(now - 7 * DAY_MS),
					withdrawnAt,
					givenBy: client.userId
				})
				.returning({ id: consents.id });
			consentId = grant!.id;
			await tx.insert(consentEvents).values({
				consentId,
				kind: 'given',
				at: new Date(now - 7 * DAY_MS),
				actorUserId: client.userId
			});
			if (withdrawnAt) {
				await tx
					.insert(consentEvents)
					.values({ consentId, kind: 'withdrawn', at: withdrawnAt, actorUserId: client.userId });
			}
		}
		const [referral] = await tx
			.insert(referrals)
			.values({
				clientId: client.id,
				studioId: orgIds.studio,
				clinicId: orgIds.clinic,
				physioId: physio,
				createdBy: instructor,
				reason:
					step.name === 'Maya Okonjo'
						? 'Pelvic heaviness by the end of class and leaking when she jumps, noted at her last screening.'
						: 'Gap still above two finger widths at the navel, with a soft midline on the curl-up.',
				urgency: step.name === 'Bea Sorensen' ? 'soon' : 'routine',
				redFlags: step.name === 'Maya Okonjo' ? ['pelvic_heaviness', 'leakage'] : [],
				state: step.state,
				createdAt: new Date(now - 6.5 * DAY_MS),
				sentAt: step.state === 'draft' ? null : sentAt,
				updatedAt: step.state === 'accepted' ? new Date(now - 5 * DAY_MS) : undefined,
				consentId
			})
			.returning({ id: referrals.id });
		const referralId = referral!.id;
		await tx.insert(referralEvents).values({
			referralId,
			toState: 'draft',
			at: new Date(now - 6.5 * DAY_MS),
			actorUserId: instructor,
			actorRole: 'instructor'
		});
		if (step.state === 'draft') continue;
		const history = await tx.select().from(screenings).where(eq(screenings.clientId, client.id));
		await tx.insert(referralSnapshots).values({
			referralId,
			takenAt: sentAt,
			client: snapshotClient(client),
			screenings: snapshotScreenings(history.filter((s) => s.takenAt <= sentAt))
		});
		await tx.insert(referralEvents).values({
			referralId,
			fromState: 'draft',
			toState: 'sent',
			at: sentAt,
			actorUserId: instructor,
			actorRole: 'instructor'
		});
		// The letter goes with the referral, made from the copy the clinic received.
		await generateReferralLetter(tx, referralId);
		if (step.state === 'accepted') {
			await tx.insert(referralEvents).values({
				referralId,
				fromState: 'sent',
				toState: 'accepted',
				at: new Date(now - 5 * DAY_MS),
				actorUserId: physio,
				actorRole: 'physiotherapist'
			});
			await seedDemoDocuments(tx, referralId, physio, new Date(now - 3 * DAY_MS));
		}
		if (step.state === 'withdrawn') {
			await tx.insert(referralEvents).values({
				referralId,
				fromState: 'sent',
				toState: 'withdrawn',
				at: new Date(now - 2 * DAY_MS),
				actorUserId: client.userId,
				actorRole: 'client',
				reason: 'consent withdrawn'
			});
		}
	}
}
