import { bigint, bigserial, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

const tz = { withTimezone: true, mode: 'date' } as const;

/**
 * The access log: one append-only row per read, write, download, export, sign-in and
 * denied attempt touching client data. Triggers (see the custom migration) refuse UPDATE,
 * DELETE and TRUNCATE; the app's database role may only INSERT and SELECT.
 * Ids and action codes only — never measurement values or document contents.
 */
export const accessLog = pgTable(
	'access_log',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		at: timestamp('at', { withTimezone: true, mode: 'date', precision: 3 }).notNull().defaultNow(),
		actorUserId: uuid('actor_user_id'),
		actorRole: text('actor_role'),
		actorOrganisationId: uuid('actor_organisation_id'),
		action: text('action').notNull(),
		targetType: text('target_type'),
		targetId: text('target_id'),
		subjectKey: uuid('subject_key'),
		outcome: text('outcome').notNull(),
		clientAddress: text('client_address'),
		userAgent: text('user_agent')
	},
	// Every filter of the admin's review answers from one of these, newest first by (at, id)
	// (keyset pagination); chosen from EXPLAIN (ANALYZE, BUFFERS) on a 1 M-row log.
	(t) => [
		index('access_log_at_id_idx').on(t.at, t.id),
		index('access_log_subject_at_idx').on(t.subjectKey, t.at, t.id),
		index('access_log_actor_org_at_idx').on(t.actorOrganisationId, t.at, t.id),
		index('access_log_actor_at_idx').on(t.actorUserId, t.at, t.id),
		index('access_log_target_at_idx').on(t.targetType, t.targetId, t.at, t.id),
		index('access_log_action_at_idx').on(t.action, t.at, t.id),
		index('access_log_outcome_at_idx').on(t.outcome, t.at, t.id)
	]
);

/** The seal chain: for each log row in id order, SHA-256(previous hash ‖ canonical JSON of the row). */
export const accessLogSeals = pgTable('access_log_seals', {
	rowId: bigint('row_id', { mode: 'number' }).primaryKey(),
	prevHash: text('prev_hash').notNull(),
	hash: text('hash').notNull(),
	sealedAt: timestamp('sealed_at', tz).notNull().defaultNow()
});

/**
 * Subject keys: the log names whose data was touched by a random key; this map from key
 * to client is the only link back. Erasing a client deletes her map row, never a log row.
 */
export const subjectKeys = pgTable('subject_keys', {
	key: uuid('key').primaryKey().defaultRandom(),
	clientId: uuid('client_id').notNull().unique(),
	createdAt: timestamp('created_at', tz).notNull().defaultNow()
});
