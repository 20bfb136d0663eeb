import { sql } from 'drizzle-orm';
import type { Executor } from '../../src/lib/server/db';

/** A minimal client record (invented), so the writer has a real client to key: returns her id. */
export async function createTestClient(executor: Executor): Promise<string> {
	const result = await executor.execute<{ id: string }>(sql`
		with studio as (
			insert into organisations (name, kind) values ('Test studio', 'studio') returning id)
		insert into clients (organisation_id, name, stage, birth_date)
		select id, 'Test client', 'postpartum', current_date - 60 from studio
		returning id`);
	return result.rows[0]!.id;
}
