import { seedDemoSelfCare } from './self-care';
import { sql } from 'drizzle-orm';
import type { Database } from '../db';
import { memberships, organisations, users } from '../db/schema';
import { seedDemoClearances } from './clearances';
import { seedDemoClients } from './clients';
import { seedDemoPlans } from './plans';
import { seedDemoDataRequests } from './privacy';
import { seedDemoReferrals } from './referrals';
import { demoOrganisations, demoPeople, type DemoOrganisationKey } from './scenario';

/** True when no organisation exists yet: `npm start` loads the demo only into an empty database. */
export async function isEmpty(database: Database): Promise<boolean> {
	const rows = await database.select({ n: sql<number>`count(*)::int` }).from(organisations);
	return (rows[0]?.n ?? 0) === 0;
}

/** Loads the demo scenario in one transaction: all of it, or nothing. */
export async function seedDemo(database: Database): Promise<void> {
	await database.transaction(async (tx) => {
		const orgIds = {} as Record<DemoOrganisationKey, string>;
		for (const [key, org] of Object.entries(demoOrganisations) as Array<
			[DemoOrganisationKey, (typeof demoOrganisations)[DemoOrganisationKey]]
		>) {
			const [row] = await tx
				.insert(organisations)
				.values({ name: org.name, kind: org.kind })
				.returning({ id: organisations.id });
			orgIds[key] = row!.id;
		}
		const userIdsByEmail: Record<string, string> = {};
		for (const person of demoPeople) {
			const [user] = await tx
				.insert(users)
				.values({ email: person.email, name: person.name })
				.returning({ id: users.id });
			userIdsByEmail[person.email] = user!.id;
			for (const { organisation, role } of person.roles) {
				await tx
					.insert(memberships)
					.values({ userId: user!.id, organisationId: orgIds[organisation], role });
			}
		}
		await seedDemoClients(tx, orgIds, userIdsByEmail);
		await seedDemoReferrals(tx, orgIds, userIdsByEmail);
		await seedDemoClearances(tx, orgIds, userIdsByEmail);
		await seedDemoPlans(tx, orgIds, userIdsByEmail);
		await seedDemoSelfCare(tx, orgIds, userIdsByEmail);
		await seedDemoDataRequests(tx, orgIds);
	});
}

/**
 * Empties every table except the append-only access log and its seals, for test runs that
 * want a known starting point. Needs the owner role (TRUNCATE is not granted to the app).
 */
export async function clearData(database: Database): Promise<void> {
	const rows = await database.execute<{ tablename: string }>(
		sql`select tablename from pg_tables where schemaname = 'public'
			and tablename not in ('access_log', 'access_log_seals')`
	);
	if (rows.rows.length === 0) return;
	const names = rows.rows.map((r) => `"${r.tablename}"`).join(', ');
	await database.execute(sql.raw(`truncate table ${names} cascade`));
}
