import { sql } from 'drizzle-orm';
import { REFERRAL_STATES } from '../../../domain/referral';
import {
	bigserial,
	check,
	index,
	jsonb,
	pgEnum,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uuid
} from 'drizzle-orm/pg-core';
import type { ShareScope } from '../../../domain/consent';
import type { RedFlag } from '../../../domain/red-flags';
import type { ReferralClient, ReferralScreening } from '../../../referrals/types';
import { users } from './auth';
import { clients } from './clients';
import { organisations } from './organisations';

// Consent to share and referrals. A grant is never edited after it is given except to stamp
// its withdrawal; every change is also an event row, so the history reads in order.

const tz = { withTimezone: true, mode: 'date' } as const;
// Millisecond precision where a timestamp is part of a list cursor: JavaScript dates carry
// milliseconds, so a cursor read back compares exactly with what PostgreSQL stores.
const tzMs = { withTimezone: true, mode: 'date', precision: 3 } as const;

/**
 * A client's grant for sharing between her studio and one clinic. Active from `starts_at`
 * until `ends_at` (exclusive) unless withdrawn earlier. A new grant for the same clinic is a
 * new row; the old one stays as history.
 */
export const consents = pgTable(
	'consents',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		studioId: uuid('studio_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		clinicId: uuid('clinic_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		scopes: text('scopes').array().$type<ShareScope[]>().notNull(),
		startsAt: timestamp('starts_at', tz).notNull(),
		endsAt: timestamp('ends_at', tz),
		withdrawnAt: timestamp('withdrawn_at', tz),
		givenBy: uuid('given_by').references(() => users.id, { onDelete: 'set null' }),
		withdrawnBy: uuid('withdrawn_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow()
	},
	(t) => [
		index('consents_client_clinic_idx').on(t.clientId, t.clinicId),
		index('consents_studio_idx').on(t.studioId),
		index('consents_clinic_idx').on(t.clinicId),
		check(
			'consents_scopes_known',
			sql`${t.scopes} <@ array['referral','screenings','clearance','documents']::text[] and cardinality(${t.scopes}) > 0`
		),
		check('consents_ends_after_start', sql`${t.endsAt} is null or ${t.endsAt} > ${t.startsAt}`)
	]
);

export const consentEventKind = pgEnum('consent_event_kind', ['given', 'withdrawn']);

/** The history of each grant: given, withdrawn — who, when. */
export const consentEvents = pgTable(
	'consent_events',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		consentId: uuid('consent_id')
			.notNull()
			.references(() => consents.id, { onDelete: 'cascade' }),
		kind: consentEventKind('kind').notNull(),
		at: timestamp('at', tz).notNull().defaultNow(),
		actorUserId: uuid('actor_user_id').references(() => users.id, { onDelete: 'set null' })
	},
	(t) => [index('consent_events_consent_idx').on(t.consentId, t.at)]
);

/** An instructor's request that the client consider sharing with a named clinic. */
export const consentRequests = pgTable(
	'consent_requests',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		clinicId: uuid('clinic_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		/** Set when she gives consent for this clinic afterwards. */
		answeredAt: timestamp('answered_at', tz),
		consentId: uuid('consent_id').references(() => consents.id, { onDelete: 'set null' })
	},
	(t) => [index('consent_requests_client_idx').on(t.clientId, t.createdAt)]
);

// The states in the order the domain lists them (the migrations created the type in this order).
export const referralState = pgEnum('referral_state', REFERRAL_STATES);
export const referralUrgency = pgEnum('referral_urgency', ['routine', 'soon']);

/** A referral from a studio's instructor to a clinic, optionally to one physiotherapist. */
export const referrals = pgTable(
	'referrals',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		/** Null once the studio erased her record: the clinic keeps its own (see privacy/erasure). */
		clientId: uuid('client_id').references(() => clients.id, { onDelete: 'set null' }),
		studioId: uuid('studio_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		clinicId: uuid('clinic_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		/** The named physiotherapist; set to the one who accepts when none was named. */
		physioId: uuid('physio_id').references(() => users.id, { onDelete: 'set null' }),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		reason: text('reason').notNull(),
		urgency: referralUrgency('urgency').notNull(),
		redFlags: text('red_flags').array().$type<RedFlag[]>().notNull(),
		state: referralState('state').notNull().default('draft'),
		createdAt: timestamp('created_at', tzMs).notNull().defaultNow(),
		sentAt: timestamp('sent_at', tzMs),
		/** The grant in force when it was sent. */
		consentId: uuid('consent_id').references(() => consents.id, { onDelete: 'set null' }),
		updatedAt: timestamp('updated_at', tz).notNull().defaultNow(),
		/**
		 * When the studio erased the client's record (GDPR Art. 17): the studio no longer sees
		 * this referral; the clinic keeps it, with what it received when it was sent.
		 */
		studioErasedAt: timestamp('studio_erased_at', tz)
	},
	(t) => [
		index('referrals_studio_idx').on(t.studioId, t.createdAt),
		index('referrals_clinic_idx').on(t.clinicId, t.sentAt),
		// The lists' order (newest first): a page of 25 is read from the index, not sorted.
		index('referrals_clinic_order_idx').on(
			t.clinicId,
			sql`coalesce(${t.sentAt}, ${t.createdAt}) desc`,
			sql`${t.id} desc`
		),
		index('referrals_studio_order_idx').on(
			t.studioId,
			sql`coalesce(${t.sentAt}, ${t.createdAt}) desc`,
			sql`${t.id} desc`
		),
		index('referrals_client_idx').on(t.clientId),
		// Past a draft it has been sent, except a draft withdrawn before sending.
		check(
			'referrals_erased_were_sent',
			sql`${t.studioErasedAt} is null or (${t.clientId} is null and ${t.sentAt} is not null)`
		),
		check(
			'referrals_sent_has_time',
			sql`${t.state} in ('draft', 'withdrawn') or ${t.sentAt} is not null`
		)
	]
);

/** Every change of a referral's state: who, in which role, when and why. */
export const referralEvents = pgTable(
	'referral_events',
	{
		id: bigserial('id', { mode: 'number' }).primaryKey(),
		referralId: uuid('referral_id')
			.notNull()
			.references(() => referrals.id, { onDelete: 'cascade' }),
		fromState: referralState('from_state'),
		toState: referralState('to_state').notNull(),
		at: timestamp('at', tz).notNull().defaultNow(),
		actorUserId: uuid('actor_user_id').references(() => users.id, { onDelete: 'set null' }),
		actorRole: text('actor_role'),
		reason: text('reason')
	},
	(t) => [index('referral_events_referral_idx').on(t.referralId, t.id)]
);

/**
 * What the clinic received when the referral was sent: the client details it needs and a
 * copy of her screening history at that moment. Never changed afterwards; it stays in the
 * clinic's records after sharing ends (labelled with the date it ended).
 */
export const referralSnapshots = pgTable('referral_snapshots', {
	referralId: uuid('referral_id')
		.primaryKey()
		.references(() => referrals.id, { onDelete: 'cascade' }),
	takenAt: timestamp('taken_at', tz).notNull(),
	client: jsonb('client').$type<ReferralClient>().notNull(),
	screenings: jsonb('screenings').$type<ReferralScreening[]>().notNull()
});

/**
 * Which referral, in which state, a person has already been logged as seeing in a list. The
 * inbox's background refresh logs an item only when it is new to her or its state changed,
 * so refreshing does not flood the access log (see referrals/service.ts, listReferrals).
 */
export const referralListViews = pgTable(
	'referral_list_views',
	{
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		referralId: uuid('referral_id')
			.notNull()
			.references(() => referrals.id, { onDelete: 'cascade' }),
		state: referralState('state').notNull(),
		seenAt: timestamp('seen_at', tz).notNull().defaultNow()
	},
	(t) => [primaryKey({ columns: [t.userId, t.referralId] })]
);
