import { sql } from 'drizzle-orm';
import { z } from 'zod';
import { actionLabel } from '../../audit-labels';
import { recordAccess } from '../audit';
import { mayReadOwnRecord } from '../clients/policy';
import { refuse, type Caller } from '../context';
import { db } from '../db';
import { notFound } from '../http/problem';
import { decodeCursor, toPage, type Page } from '../http/schemas';

// "Who looked at or changed my record": the access-log rows that name the client (through her
// subject key), newest first, for the client herself. Names are shown with their
// organisation and role, whatever organisation they belong to (GDPR Art. 15(1)(c): the
// recipients of her data); her own actions are marked as hers. Reading the list is logged too.

export interface OwnAccessItem {
	at: string;
	actor: { name: string | null; role: string | null; organisation: string | null };
	/** True where she did it herself. */
	you: boolean;
	/** Seamwell's own background work (a reminder, a seal), not a person. */
	system: boolean;
	action: string;
	label: string;
	outcome: string;
}

const cursorSchema = z.object({ at: z.number().int(), id: z.number().int().positive() });

type Row = {
	id: string;
	at_ms: string;
	actor_user_id: string | null;
	actor_name: string | null;
	actor_role: string | null;
	organisation: string | null;
	action: string;
	outcome: string;
};

/** Policy: the client herself (mayReadOwnRecord). Audit: client.access_read on her record. */
export async function listOwnAccess(
	caller: Caller,
	query: { limit: number; cursor?: string }
): Promise<Page<OwnAccessItem>> {
	const actor = caller.actor;
	if (!mayReadOwnRecord(actor)) {
		return refuse(caller, 'client.access_read', notFound('You have no client record in Seamwell.'));
	}
	const after = decodeCursor(query.cursor, cursorSchema);
	const clientId = actor.clientId;
	return db().transaction(async (tx) => {
		const rows = await tx.execute<Row>(sql`
			with page as materialized (
				select l.id, l.at, l.actor_user_id, l.actor_role, l.actor_organisation_id, l.action,
					l.outcome
				from access_log l
				where l.subject_key = (select k.key from subject_keys k where k.client_id = ${clientId})
					${
						after
							? sql`and (l.at, l.id) < (${new Date(after.at).toISOString()}::timestamptz, ${after.id})`
							: sql``
					}
				order by l.at desc, l.id desc
				limit ${query.limit + 1}
			)
			select p.id::text as id, (extract(epoch from p.at) * 1000)::bigint::text as at_ms,
				p.actor_user_id::text as actor_user_id, u.name as actor_name, p.actor_role,
				o.name as organisation, p.action, p.outcome
			from page p
			left join users u on u.id = p.actor_user_id
			left join organisations o on o.id = p.actor_organisation_id
			order by p.at desc, p.id desc`);
		await recordAccess(tx, caller.access, {
			action: 'client.access_read',
			outcome: 'success',
			target: { type: 'client', id: clientId },
			clientId
		});
		const page = toPage(rows.rows, query.limit, (last) => ({
			at: Number(last.at_ms),
			id: Number(last.id)
		}));
		return {
			items: page.items.map((r) => ({
				at: new Date(Number(r.at_ms)).toISOString(),
				actor: { name: r.actor_name, role: r.actor_role, organisation: r.organisation },
				you: r.actor_user_id === actor.userId,
				system: r.actor_user_id === null && r.actor_role === 'system',
				action: r.action,
				label: actionLabel(r.action),
				outcome: r.outcome
			})),
			nextCursor: page.nextCursor
		};
	});
}
