import { sql } from 'drizzle-orm';
import type { Caller } from '../../context';
import { db } from '../../db';
import { recordAccess } from '../writer';
import { notFound } from '../../http/problem';
import { refuse } from '../../context';
import { decodeCursor, toPage, type Page } from '../../http/schemas';
import type { ReviewQuery } from './filters';
import {
	asReviewer,
	assertClientInScope,
	assertReviewer,
	cursorOf,
	cursorSchema,
	eventsQuery,
	fetchEvents,
	toItem,
	type AccessEventItem,
	type EventRow
} from './events';

/** Policy: admin of the active organisation, her scope only. Audit: audit.read. */
export async function listAccessEvents(
	caller: Caller,
	q: ReviewQuery
): Promise<Page<AccessEventItem>> {
	const reviewer = await assertReviewer(caller, 'audit.read');
	const after = decodeCursor(q.cursor, cursorSchema);
	await assertClientInScope(caller, reviewer, q, 'audit.read');
	return db().transaction(async (tx) => {
		const rows = await fetchEvents(tx, reviewer, q, after, q.limit + 1);
		await recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.read',
			outcome: 'success',
			target: { type: 'organisation', id: reviewer.organisationId },
			clientId: q.client ?? null
		});
		return toPage(rows, q.limit, cursorOf);
	});
}

/** Policy: admin of the active organisation; an event outside her scope is 404 (logged). Audit: audit.read. */
export async function getAccessEvent(caller: Caller, id: number): Promise<AccessEventItem> {
	const reviewer = await assertReviewer(caller, 'audit.read');
	const target = { type: 'access_event', id: String(id) };
	return db().transaction(async (tx) => {
		const result = await tx.execute<EventRow>(
			eventsQuery(reviewer, { limit: 1 }, null, 1, [sql`l.id = ${id}`])
		);
		const row = result.rows[0];
		if (!row) return refuse(caller, 'audit.read', notFound(), target);
		await recordAccess(tx, asReviewer(caller, reviewer), {
			action: 'audit.read',
			outcome: 'success',
			target
		});
		return toItem(row);
	});
}
