import { sql } from 'drizzle-orm';
import { config } from './config';
import { db } from './db';

// The benchmark's framework baseline (`npm run bench`, route /bench/query): the one indexed
// query the bare Node.js baseline runs, so the two differ only by SvelteKit and our hooks.
// Reachable only when the bench started the app with SEAMWELL_BENCH=1.

export const benchEnabled = () => config().SEAMWELL_BENCH === '1';

export async function benchBaselineQuery(organisationId: string): Promise<unknown[]> {
	const rows = await db().execute(
		sql`select id, name from clients where organisation_id = ${organisationId}::uuid
			order by name limit 25`
	);
	return rows.rows;
}
