import { sql } from 'drizzle-orm';
import {
	boolean,
	check,
	date,
	index,
	jsonb,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import type { AdviceLevel, RedFlag, SelfCheckSites } from '../../../domain';
import { users } from './auth';
import { clients } from './clients';
import { organisations } from './organisations';

// What the client does between sessions: her own self-checks and her home practice. Every row
// hangs off her client record (client_id), so the privacy centre can export and erase them.

const tz = { withTimezone: true, mode: 'date' } as const;

/**
 * One self-check she recorded: the symptoms she ticked and, where the finger-width part was
 * offered, what she felt at the three places. The advice level is kept as it was given. Never
 * part of the studio's screenings, trend or outcome.
 */
export const selfChecks = pgTable(
	'self_checks',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		takenAt: timestamp('taken_at', tz).notNull(),
		symptoms: text('symptoms').array().$type<RedFlag[]>().notNull(),
		sites: jsonb('sites').$type<SelfCheckSites>(),
		woundHealed: boolean('wound_healed'),
		adviceLevel: text('advice_level').$type<AdviceLevel>().notNull(),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		/** When an instructor of her studio marked it followed up (it leaves the dashboard). */
		followedUpAt: timestamp('followed_up_at', tz),
		followedUpBy: uuid('followed_up_by').references(() => users.id, { onDelete: 'set null' })
	},
	(t) => [index('self_checks_client_taken_idx').on(t.clientId, t.takenAt)]
);

/**
 * Her choice, per studio, to let its instructors see her self-checks (off by default: no row
 * means not shared). Separate from consent to share with a clinic.
 */
export const selfCheckSharing = pgTable(
	'self_check_sharing',
	{
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		shared: boolean('shared').notNull(),
		changedAt: timestamp('changed_at', tz).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.clientId, t.organisationId] })]
);

export interface HomePracticeItem {
	exerciseId: string;
	reps: string | null;
	note: string | null;
}

/** The home practice her instructor gave her: one current list per client, replaced whole. */
export const homePractices = pgTable('home_practices', {
	clientId: uuid('client_id')
		.primaryKey()
		.references(() => clients.id, { onDelete: 'cascade' }),
	organisationId: uuid('organisation_id')
		.notNull()
		.references(() => organisations.id, { onDelete: 'cascade' }),
	items: jsonb('items').$type<HomePracticeItem[]>().notNull(),
	setBy: uuid('set_by').references(() => users.id, { onDelete: 'set null' }),
	updatedAt: timestamp('updated_at', tz).notNull().defaultNow()
});

/** One practice she marked done: whether it felt all right, and what felt wrong. */
export const homePracticeSessions = pgTable(
	'home_practice_sessions',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		doneAt: timestamp('done_at', tz).notNull(),
		feltOk: boolean('felt_ok').notNull(),
		note: text('note'),
		symptoms: text('symptoms').array().$type<RedFlag[]>().notNull(),
		adviceLevel: text('advice_level').$type<AdviceLevel>(),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		/** When an instructor of her studio marked it followed up (it leaves the dashboard). */
		followedUpAt: timestamp('followed_up_at', tz),
		followedUpBy: uuid('followed_up_by').references(() => users.id, { onDelete: 'set null' })
	},
	(t) => [
		index('home_practice_sessions_client_done_idx').on(t.clientId, t.doneAt),
		check(
			'home_practice_sessions_ok_without_symptoms',
			sql`not ${t.feltOk} or cardinality(${t.symptoms}) = 0`
		)
	]
);

/** Her opt-in to a practice reminder every 4 weeks; no row means no reminders. */
export const homePracticeReminders = pgTable('home_practice_reminders', {
	clientId: uuid('client_id')
		.primaryKey()
		.references(() => clients.id, { onDelete: 'cascade' }),
	nextDueOn: date('next_due_on', { mode: 'string' }).notNull(),
	createdAt: timestamp('created_at', tz).notNull().defaultNow()
});
