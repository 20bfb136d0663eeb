import { sql } from 'drizzle-orm';
import {
	bigint,
	pgSequence,
	boolean,
	check,
	date,
	index,
	integer,
	jsonb,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import type {
	EarlyScreenWarning,
	RedFlag,
	ScreeningReason,
	Site,
	SiteMeasure
} from '../../../domain';
import { users } from './auth';
import { organisations } from './organisations';

const tz = { withTimezone: true, mode: 'date' } as const;

export const clientStage = pgEnum('client_stage', ['pregnant', 'postpartum']);
export const deliveryKind = pgEnum('delivery_kind', ['vaginal', 'caesarean']);
export const intakeConsentMethod = pgEnum('intake_consent_method', [
	'in_person',
	'signed_form',
	'online'
]);
export const screeningOutcome = pgEnum('screening_outcome', ['within_limit', 'monitor', 'refer']);

/**
 * A studio's client record. Dates of the pregnancy or birth are kept (not weeks), so weeks are
 * computed on the day they are needed. The last screening's time and outcome are copied here
 * in the transaction that records it, so the list sorts and filters without a subquery.
 */
/** Where every client's limits version is drawn from (see `clients.limitsVersion`). */
export const clientsLimitsVersionSeq = pgSequence('clients_limits_version_seq');

export const clients = pgTable(
	'clients',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		/** The person who signs in as this client, once invited. */
		userId: uuid('user_id')
			.unique()
			.references(() => users.id, { onDelete: 'set null' }),
		name: text('name').notNull(),
		email: text('email'),
		birthYear: integer('birth_year'),
		stage: clientStage('stage').notNull(),
		dueDate: date('due_date', { mode: 'string' }),
		birthDate: date('birth_date', { mode: 'string' }),
		delivery: deliveryKind('delivery'),
		births: integer('births'),
		multiples: boolean('multiples'),
		postnatalCheckOn: date('postnatal_check_on', { mode: 'string' }),
		/** Null while unknown or before the check. */
		postnatalCleared: boolean('postnatal_cleared'),
		notes: text('notes'),
		intakeConsentAt: timestamp('intake_consent_at', tz),
		intakeConsentMethod: intakeConsentMethod('intake_consent_method'),
		intakeConsentTakenBy: uuid('intake_consent_taken_by').references(() => users.id, {
			onDelete: 'set null'
		}),
		lastScreenedAt: timestamp('last_screened_at', tz),
		lastOutcome: screeningOutcome('last_outcome'),
		/**
		 * Raised by triggers (migration 0013) whenever anything her movement limits are computed
		 * from changes: this row's own columns, her screenings, clearances, self-checks, practice
		 * sessions or self-check sharing. The limits memo (clearance/limits-memo.ts) keys on it.
		 * Drawn from one sequence, so a value is never reused, even for a row deleted and made
		 * again with the same id.
		 */
		limitsVersion: bigint('limits_version', { mode: 'number' })
			.notNull()
			.default(sql`nextval('clients_limits_version_seq')`),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', tz).notNull().defaultNow()
	},
	(t) => [
		index('clients_org_name_idx').on(t.organisationId, t.name),
		index('clients_org_last_screened_idx').on(t.organisationId, t.lastScreenedAt),
		check('clients_email_lowercase', sql`${t.email} = lower(${t.email})`),
		check(
			'clients_stage_dates',
			sql`(${t.stage} = 'pregnant' and ${t.dueDate} is not null) or (${t.stage} = 'postpartum' and ${t.birthDate} is not null)`
		),
		check(
			'clients_intake_consent_whole',
			sql`(${t.intakeConsentAt} is null) = (${t.intakeConsentMethod} is null)`
		)
	]
);

/** A stored classification reason: the domain's reason as it read when the screening was taken. */
export type StoredReason = ScreeningReason;

/**
 * One finger-width check. The outcome, reasons, rules version and the client's weeks are
 * stored as they were at the time: a later change of rules or dates never rewrites history.
 */
export const screenings = pgTable(
	'screenings',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		takenAt: timestamp('taken_at', tz).notNull(),
		recordedBy: uuid('recorded_by').references(() => users.id, { onDelete: 'set null' }),
		sites: jsonb('sites').$type<Record<Site, SiteMeasure>>().notNull(),
		redFlags: text('red_flags').array().$type<RedFlag[]>().notNull(),
		notes: text('notes'),
		stage: clientStage('stage').notNull(),
		weeksPostpartum: integer('weeks_postpartum'),
		weeksOfGestation: integer('weeks_of_gestation'),
		postnatalCheckDone: boolean('postnatal_check_done'),
		outcome: screeningOutcome('outcome').notNull(),
		reasons: jsonb('reasons').$type<StoredReason[]>().notNull(),
		warnings: jsonb('warnings').$type<EarlyScreenWarning[]>().notNull(),
		rulesVersion: text('rules_version').notNull(),
		/**
		 * She has been seen by her doctor or midwife for an earlier warning sign, and it has
		 * gone (asked only when an earlier screening had a sign that refers to a doctor).
		 */
		medicalSignResolved: boolean('medical_sign_resolved'),
		createdAt: timestamp('created_at', tz).notNull().defaultNow()
	},
	(t) => [index('screenings_client_taken_idx').on(t.clientId, t.takenAt)]
);
