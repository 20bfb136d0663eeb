import { sql } from 'drizzle-orm';
import {
	check,
	date,
	index,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import { users } from './auth';
import { clients } from './clients';
import { organisations } from './organisations';

// A client's request that her studio erase her data (GDPR Art. 17), answered by the studio's
// admin within a month (Art. 12(3)). The row outlives the erasure as the studio's record of
// having answered, but no longer points at her: `client_id` becomes null and nothing else in
// it names her.

const tz = { withTimezone: true, mode: 'date' } as const;
const tzMs = { withTimezone: true, mode: 'date', precision: 3 } as const;

export const erasureState = pgEnum('erasure_state', ['open', 'approved', 'declined']);

export const erasureRequests = pgTable(
	'erasure_requests',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		/** The studio that must answer. */
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		/** Null once approved: the client record is gone. */
		clientId: uuid('client_id').references(() => clients.id, { onDelete: 'set null' }),
		requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
		requestedAt: timestamp('requested_at', tzMs).notNull().defaultNow(),
		/** One month after the request (Art. 12(3)); see domain/erasure.ts. */
		dueOn: date('due_on', { mode: 'string' }).notNull(),
		state: erasureState('state').notNull().default('open'),
		decidedBy: uuid('decided_by').references(() => users.id, { onDelete: 'set null' }),
		decidedAt: timestamp('decided_at', tz),
		/** Required when declined: the client reads it. */
		reason: text('reason'),
		/** What was erased, as counts per kind (no values): the studio's proof of the work. */
		erased: text('erased')
	},
	(t) => [
		index('erasure_requests_org_idx').on(t.organisationId, t.state, t.dueOn),
		uniqueIndex('erasure_requests_one_open')
			.on(t.clientId)
			.where(sql`${t.state} = 'open'`),
		check('erasure_requests_decided_whole', sql`(${t.state} = 'open') = (${t.decidedAt} is null)`),
		check(
			'erasure_requests_decline_has_reason',
			sql`${t.state} <> 'declined' or (${t.reason} is not null and length(${t.reason}) > 0)`
		),
		check(
			'erasure_requests_approved_detached',
			sql`${t.state} <> 'approved' or ${t.clientId} is null`
		)
	]
);
