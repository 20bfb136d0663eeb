import { and, eq } from 'drizzle-orm';
import type { Transaction } from '../db';
import {
	clients,
	homePractices,
	homePracticeSessions,
	selfChecks,
	selfCheckSharing
} from '../db/schema';
import type { DemoOrganisationKey } from './scenario';

// Hana (the demo client) checks herself between classes and shares her self-checks with
// Linden Row Studio; her instructor gave her a home practice she has been marking done. All
// values are invented for the demo. No symptoms are reported, so her limits stay as seeded.

const DAY_MS = 86_400_000;
const ago = (days: number, hour = 8) => {
	const at = new Date(Date.now() - days * DAY_MS);
	at.setUTCHours(hour, 0, 0, 0);
	return at;
};

export async function seedDemoSelfCare(
	tx: Transaction,
	orgIds: Record<DemoOrganisationKey, string>,
	userIdsByEmail: Record<string, string>
): Promise<void> {
	const [hana] = await tx
		.select({ id: clients.id })
		.from(clients)
		.where(and(eq(clients.organisationId, orgIds.studio), eq(clients.name, 'Hana Lindqvist')));
	if (!hana) return;
	await tx
		.insert(selfCheckSharing)
		.values({ clientId: hana.id, organisationId: orgIds.studio, shared: true });
	const felt = (width: number, extra: { deep?: boolean; doming?: boolean } = {}) => ({
		widthFingers: width,
		deep: extra.deep ?? false,
		doming: extra.doming ?? false
	});
	await tx.insert(selfChecks).values([
		{
			clientId: hana.id,
			takenAt: ago(5, 20),
			symptoms: [],
			sites: { above_navel: felt(1), at_navel: felt(1.5), below_navel: felt(1) },
			adviceLevel: 'thanks'
		},
		{
			clientId: hana.id,
			takenAt: ago(1, 21),
			symptoms: [],
			sites: { above_navel: felt(1), at_navel: felt(2, { doming: true }), below_navel: felt(1) },
			adviceLevel: 'show_instructor'
		}
	]);
	await tx.insert(homePractices).values({
		clientId: hana.id,
		organisationId: orgIds.studio,
		items: [
			{ exerciseId: 'back-lying-breath-deep-core', reps: '5 slow breaths', note: null },
			{ exerciseId: 'heel-slides', reps: '8 each side', note: 'Keep the ribs soft.' },
			{ exerciseId: 'bent-knee-fall-outs', reps: '8 each side', note: null }
		],
		setBy: userIdsByEmail['instructor@studio.example'] ?? null,
		updatedAt: ago(20)
	});
	await tx.insert(homePracticeSessions).values([
		{ clientId: hana.id, doneAt: ago(16, 7), feltOk: true, symptoms: [] },
		{ clientId: hana.id, doneAt: ago(12, 7), feltOk: true, symptoms: [] },
		{ clientId: hana.id, doneAt: ago(9, 7), feltOk: true, symptoms: [] },
		{
			clientId: hana.id,
			doneAt: ago(3, 19),
			feltOk: false,
			note: 'My hips felt tight on the fall-outs.',
			symptoms: [],
			adviceLevel: 'thanks'
		},
		{ clientId: hana.id, doneAt: ago(2, 7), feltOk: true, symptoms: [] }
	]);
}
