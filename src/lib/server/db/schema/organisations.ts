import { sql } from 'drizzle-orm';
import {
	boolean,
	check,
	index,
	pgEnum,
	pgTable,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import { users } from './auth';

const tz = { withTimezone: true, mode: 'date' } as const;

export const organisationKind = pgEnum('organisation_kind', ['studio', 'clinic']);
export const memberRole = pgEnum('member_role', ['instructor', 'physiotherapist', 'admin']);

export const organisations = pgTable('organisations', {
	id: uuid('id').primaryKey().defaultRandom(),
	name: text('name').notNull(),
	kind: organisationKind('kind').notNull(),
	createdAt: timestamp('created_at', tz).notNull().defaultNow()
});

export const memberships = pgTable(
	'memberships',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		userId: uuid('user_id')
			.notNull()
			.references(() => users.id, { onDelete: 'cascade' }),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		role: memberRole('role').notNull(),
		active: boolean('active').notNull().default(true),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		deactivatedAt: timestamp('deactivated_at', tz)
	},
	(t) => [
		uniqueIndex('memberships_person_org_role_uq').on(t.userId, t.organisationId, t.role),
		index('memberships_org_idx').on(t.organisationId)
	]
);

export const invitations = pgTable(
	'invitations',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		email: text('email').notNull(),
		role: memberRole('role').notNull(),
		// Only a SHA-256 of the link's token is kept; the token itself lives in the mail.
		tokenHash: text('token_hash').notNull().unique(),
		invitedBy: uuid('invited_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		expiresAt: timestamp('expires_at', tz).notNull(),
		acceptedAt: timestamp('accepted_at', tz),
		revokedAt: timestamp('revoked_at', tz)
	},
	(t) => [
		index('invitations_org_idx').on(t.organisationId),
		check('invitations_email_lowercase', sql`${t.email} = lower(${t.email})`)
	]
);
