import { sql } from 'drizzle-orm';
import {
	boolean,
	check,
	index,
	integer,
	pgTable,
	primaryKey,
	real,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';

// Tables Auth.js reads and writes through its Drizzle adapter. The JS property names are
// the adapter's own (sessionToken, userId, expires, identifier, token …); the SQL names are ours.

const tz = { withTimezone: true, mode: 'date' } as const;

export const users = pgTable(
	'users',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		name: text('name'),
		// Stored lowercased: Auth.js lowercases the address before it looks a person up.
		email: text('email').notNull().unique(),
		emailVerified: timestamp('email_verified', tz),
		image: text('image'),
		// A deactivated person gets no sign-in mail and no session.
		active: boolean('active').notNull().default(true),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		// An examiner's own millimetres per finger width, for showing finger widths as an
		// approximate mm estimate; null uses the default (DEFAULT_MM_PER_FINGER). Display only:
		// never fed into a criterion.
		mmPerFinger: real('mm_per_finger')
	},
	(t) => [check('users_mm_per_finger_range', sql`${t.mmPerFinger} between 5 and 40`)]
);

export const accounts = pgTable(
	'accounts',
	{
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		type: text('type').notNull(),
		provider: text('provider').notNull(),
		providerAccountId: text('provider_account_id').notNull(),
		refresh_token: text('refresh_token'),
		access_token: text('access_token'),
		expires_at: integer('expires_at'),
		token_type: text('token_type'),
		scope: text('scope'),
		id_token: text('id_token'),
		session_state: text('session_state')
	},
	(t) => [primaryKey({ columns: [t.provider, t.providerAccountId] })]
);

export const sessions = pgTable(
	'sessions',
	{
		sessionToken: text('session_token').primaryKey(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		expires: timestamp('expires', tz).notNull(),
		// When the session began: the absolute lifetime counts from here and never slides.
		createdAt: timestamp('created_at', tz).notNull().defaultNow()
	},
	(t) => [index('sessions_user_idx').on(t.userId)]
);

export const verificationTokens = pgTable(
	'verification_tokens',
	{
		identifier: text('identifier').notNull(),
		token: text('token').notNull(),
		expires: timestamp('expires', tz).notNull()
	},
	(t) => [primaryKey({ columns: [t.identifier, t.token] })]
);

// Sign-in requests counted in the database, so several app processes share one count.
export const rateLimitHits = pgTable(
	'rate_limit_hits',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		bucket: text('bucket').notNull(),
		key: text('key').notNull(),
		at: timestamp('at', tz)
			.notNull()
			.default(sql`now()`)
	},
	(t) => [index('rate_limit_hits_lookup_idx').on(t.bucket, t.key, t.at)]
);
