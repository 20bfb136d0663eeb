import { sql } from 'drizzle-orm';
import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';

const tz = { withTimezone: true, mode: 'date' } as const;

/**
 * `expired`: a sign-in link not delivered within its lifetime, dropped rather than sent late;
 * `superseded`: a sign-in link replaced by a newer one before it was sent.
 */
export const outboxState = pgEnum('outbox_state', [
	'pending',
	'sent',
	'failed',
	'expired',
	'superseded'
]);

/** Every mail Seamwell sends is first a row here, written in the transaction that causes it. */
export const outbox = pgTable(
	'outbox',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		to: text('to').notNull(),
		subject: text('subject').notNull(),
		text: text('text').notNull(),
		html: text('html'),
		// A short code for what kind of mail this is (signin.link, invitation …), for tests and support.
		kind: text('kind').notNull(),
		state: outboxState('state').notNull().default('pending'),
		attempts: integer('attempts').notNull().default(0),
		nextAttemptAt: timestamp('next_attempt_at', tz)
			.notNull()
			.default(sql`now()`),
		lastError: text('last_error'),
		// Retries go on until this moment plus the retry window (48 h); "send again" resets it.
		retryFrom: timestamp('retry_from', tz).notNull().defaultNow(),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		sentAt: timestamp('sent_at', tz)
	},
	(t) => [index('outbox_due_idx').on(t.state, t.nextAttemptAt)]
);
