import { and, eq } from 'drizzle-orm';
import { erasureDueOn } from '../../domain/erasure';
import type { Transaction } from '../db';
import { clients, erasureRequests } from '../db/schema';
import type { DemoOrganisationKey } from './scenario';

// Clara Nwosu (an invented client of Linden Row) asked the studio to erase her data 26 days
// ago: the studio admin's dashboard shows it waiting, with five days or so left to answer.
// Hana, the demo client who signs in, has asked nothing, so she can try asking herself.

const DAY_MS = 86_400_000;

export async function seedDemoDataRequests(
	tx: Transaction,
	orgIds: Record<DemoOrganisationKey, string>
): Promise<void> {
	const [clara] = await tx
		.select({ id: clients.id })
		.from(clients)
		.where(and(eq(clients.name, 'Clara Nwosu'), eq(clients.organisationId, orgIds.studio)));
	if (!clara) throw new Error('demo: Clara Nwosu is missing');
	const requestedAt = new Date(Date.now() - 26 * DAY_MS);
	await tx.insert(erasureRequests).values({
		organisationId: orgIds.studio,
		clientId: clara.id,
		requestedAt,
		dueOn: erasureDueOn(requestedAt)
	});
}
