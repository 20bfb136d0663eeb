import { sql } from 'drizzle-orm';
import {
	check,
	index,
	integer,
	jsonb,
	pgTable,
	primaryKey,
	text,
	timestamp,
	uniqueIndex,
	uuid
} from 'drizzle-orm/pg-core';
import type { MovementCategory } from '../../../domain/movement';
import type { Position } from '../../../domain/exercises/library';
import type { PlanItem, PlanCheckSnapshot, OverriddenCell } from '../../../plans/types';
import { users } from './auth';
import { clients } from './clients';
import { clearances } from './clearance';
import { organisations } from './organisations';

// Session plans and a studio's own exercises. The shipped library lives in
// src/lib/domain/exercises/library.ts (its slugs are the public ids); only exercises a studio
// adds are rows here. A plan's items name exercises by id — a shipped slug or a custom UUID.

const tz = { withTimezone: true, mode: 'date' } as const;

/** An exercise a studio's instructors added: visible to that studio only, same fields as shipped. */
export const studioExercises = pgTable(
	'studio_exercises',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		slug: text('slug').notNull(),
		name: text('name').notNull(),
		description: text('description').notNull(),
		position: text('position').$type<Position>().notNull(),
		difficulty: integer('difficulty').notNull(),
		categories: jsonb('categories').$type<MovementCategory[]>().notNull(),
		alternativeIds: jsonb('alternative_ids').$type<string[]>().notNull(),
		why: text('why').notNull().default(''),
		/** The shipped exercise it was copied from, if any. */
		copiedFrom: text('copied_from'),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow()
	},
	(t) => [
		uniqueIndex('studio_exercises_org_slug_idx').on(t.organisationId, t.slug),
		check('studio_exercises_difficulty', sql`${t.difficulty} between 1 and 3`),
		check('studio_exercises_has_category', sql`jsonb_array_length(${t.categories}) > 0`)
	]
);

/**
 * A session plan, owned by the studio: any of its instructors may open and edit it. `version`
 * goes up by one on every save; a save naming an older version is refused (409).
 */
export const plans = pgTable(
	'plans',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		organisationId: uuid('organisation_id')
			.notNull()
			.references(() => organisations.id, { onDelete: 'cascade' }),
		title: text('title').notNull(),
		scheduledFor: timestamp('scheduled_for', tz),
		items: jsonb('items').$type<PlanItem[]>().notNull(),
		version: integer('version').notNull().default(1),
		/** Set when marked ready; cleared by any later change. */
		readyAt: timestamp('ready_at', tz),
		readyBy: uuid('ready_by').references(() => users.id, { onDelete: 'set null' }),
		/** Each cell's status when it was marked ready, to say what changed since. */
		readyCheck: jsonb('ready_check').$type<PlanCheckSnapshot>(),
		archivedAt: timestamp('archived_at', tz),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		updatedBy: uuid('updated_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		updatedAt: timestamp('updated_at', tz).notNull().defaultNow()
	},
	(t) => [
		index('plans_org_updated_idx').on(t.organisationId, t.updatedAt),
		check('plans_items_max', sql`jsonb_array_length(${t.items}) <= 60`),
		check('plans_version_positive', sql`${t.version} >= 1`)
	]
);

/** Who a plan is for, in roster order. Erasing a client removes her from every plan. */
export const planClients = pgTable(
	'plan_clients',
	{
		planId: uuid('plan_id')
			.notNull()
			.references(() => plans.id, { onDelete: 'cascade' }),
		clientId: uuid('client_id')
			.notNull()
			.references(() => clients.id, { onDelete: 'cascade' }),
		position: integer('position').notNull()
	},
	(t) => [
		primaryKey({ columns: [t.planId, t.clientId] }),
		index('plan_clients_client_idx').on(t.clientId)
	]
);

/** A studio's written override of its own provisional holds, for the cells it covered. */
export const planOverrides = pgTable(
	'plan_overrides',
	{
		id: uuid('id').primaryKey().defaultRandom(),
		planId: uuid('plan_id')
			.notNull()
			.references(() => plans.id, { onDelete: 'cascade' }),
		planVersion: integer('plan_version').notNull(),
		reason: text('reason').notNull(),
		cells: jsonb('cells').$type<OverriddenCell[]>().notNull(),
		createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow()
	},
	(t) => [index('plan_overrides_plan_idx').on(t.planId, t.createdAt)]
);

/**
 * An instructor's request that the clinic which set a client's clearance review it. Carries no
 * health details: the physio opens the client's record to see why.
 */
export const clearanceReviewRequests = pgTable(
	'clearance_review_requests',
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
		clearanceId: uuid('clearance_id').references(() => clearances.id, { onDelete: 'set null' }),
		exerciseId: text('exercise_id'),
		note: text('note').notNull(),
		requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
		createdAt: timestamp('created_at', tz).notNull().defaultNow(),
		seenAt: timestamp('seen_at', tz)
	},
	(t) => [index('clearance_review_requests_clinic_idx').on(t.clinicId, t.createdAt)]
);
