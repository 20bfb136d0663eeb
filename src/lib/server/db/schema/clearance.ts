import { sql } from 'drizzle-orm';
import {
	check,
	date,
	index,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid,
	type AnyPgColumn
} from 'drizzle-orm/pg-core';
import type {
	AssessmentPoint,
	ClearanceLevels,
	ClearanceModifications
} from '../../../clearance/types';
import { users } from './auth';
import { clients, clientStage } from './clients';
import { organisations } from './organisations';
import { referrals } from './sharing';

// A physiotherapist's assessments and the clearances she sets. Both are appended, never
// edited: a later assessment is a new row, a new clearance supersedes the one before and the
// old one stays as history. The only later writes are the stamps below — the date sharing
// ended (so the studio's copy is labelled) and when the review reminder was queued.

const tz = { withTimezone: true, mode: 'date' } as const;
// Millisecond precision: compared with screenings' recording times (see knownUntil).
const tzMs = { withTimezone: true, mode: 'date', precision: 3 } as const;

export const herniaFinding = pgEnum('hernia_finding', ['none', 'suspected', 'found']);

/** A physiotherapist's findings for one referral. */
export const assessments = pgTable(
	'assessments',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		referralId: uuid('referral_id')
			.notNull()
			.references(() => referrals.id, { onDelete: 'cascade' }),
		/** Null once the studio erased her record: the clinic keeps its own (see privacy/erasure). */
		clientId: uuid('client_id').references(() => clients.id, { onDelete: 'set null' }),
		clinicId: uuid('clinic_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		points: jsonb('points').$type<AssessmentPoint[]>().notNull(),
		hernia: herniaFinding('hernia').notNull(),
		pelvicFloor: text('pelvic_floor'),
		plan: text('plan').notNull(),
		recordedBy: uuid('recorded_by').references(() => users.id, { onDelete: 'set null' }),
		recordedAt: timestamp('recorded_at', tzMs).notNull().defaultNow()
	},
	(t) => [
		index('assessments_referral_idx').on(t.referralId, t.recordedAt),
		check('assessments_has_points', sql`jsonb_array_length(${t.points}) > 0`)
	]
);

/**
 * A clinic's clearance for one client: a level per movement category, the written change for
 * each `modify`, notes and a review date. The newest row that nothing supersedes is current.
 */
export const clearances = pgTable(
	'clearances',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		/** Null once the studio erased her record: the clinic keeps its own (see privacy/erasure). */
		clientId: uuid('client_id').references(() => clients.id, { onDelete: 'set null' }),
		clinicId: uuid('clinic_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		referralId: uuid('referral_id').references(() => referrals.id, { onDelete: 'set null' }),
		levels: jsonb('levels').$type<ClearanceLevels>().notNull(),
		modifications: jsonb('modifications').$type<ClearanceModifications>().notNull(),
		notes: text('notes'),
		reviewOn: date('review_on', { mode: 'string' }).notNull(),
		setBy: uuid('set_by').references(() => users.id, { onDelete: 'set null' }),
		setAt: timestamp('set_at', tzMs).notNull().defaultNow(),
		/** The client's stage when it was set: a clearance set in pregnancy lapses at the birth. */
		stageAtSet: clientStage('stage_at_set').notNull(),
		/** Screenings recorded up to this moment were shared with the clinic when it was set. */
		knownUntil: timestamp('known_until', tzMs).notNull(),
		/** The clearance this one replaces (one successor at most). */
		supersedes: uuid('supersedes').references((): AnyPgColumn => clearances.id, {
			onDelete: 'set null'
		}),
		/** The day the client withdrew sharing with this clinic: the studio keeps this copy. */
		sharingEndedOn: date('sharing_ended_on', { mode: 'string' }),
		/** When the review reminder was queued (once, whichever app process claims it). */
		reminderSentAt: timestamp('reminder_sent_at', tz)
	},
	(t) => [
		index('clearances_client_idx').on(t.clientId, t.setAt),
		index('clearances_review_idx').on(t.reviewOn),
		uniqueIndex('clearances_supersedes_unique').on(t.supersedes)
	]
);
