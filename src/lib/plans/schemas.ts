import { z } from 'zod';
import { text, requiredText, optionalText } from '$lib/schemas/text';
import { MOVEMENT_CATEGORIES } from '../domain/movement';
import { POSITIONS } from '../domain/exercises/library';

// Input schemas for exercises and session plans, shared by the JSON API and the browser.

export const MAX_PLAN_CLIENTS = 30;
export const MAX_PLAN_ITEMS = 60;

/** A shipped slug or a studio exercise's UUID. */
export const exerciseId = text(120).pipe(
	z.string().regex(/^[a-z0-9]+(-[a-z0-9]+)*$|^[0-9a-f-]{36}$/i, 'not an exercise id')
);

function noDuplicates(values: readonly string[]): boolean {
	return new Set(values).size === values.length;
}

export const exerciseCreateSchema = z.strictObject({
	name: requiredText(120),
	description: requiredText(2000),
	position: z.enum(POSITIONS),
	difficulty: z.union([z.literal(1), z.literal(2), z.literal(3)]),
	categories: z
		.array(z.enum(MOVEMENT_CATEGORIES))
		.min(1, 'at least one category')
		.refine(noDuplicates, 'duplicate categories'),
	alternativeIds: z
		.array(exerciseId)
		.max(3, 'at most 3 alternatives')
		.refine(noDuplicates, 'duplicate alternatives')
		.default([]),
	why: text(500).optional(),
	copiedFrom: exerciseId.optional()
});
export type ExerciseCreateInput = z.infer<typeof exerciseCreateSchema>;

export const exerciseQuerySchema = z.object({
	category: z.enum(MOVEMENT_CATEGORIES).optional(),
	position: z.enum(POSITIONS).optional(),
	difficulty: z.coerce.number().int().min(1).max(3).optional(),
	q: text(100).optional(),
	limit: z.coerce.number().int().min(1).max(100).default(100),
	cursor: text(500).optional()
});

const clientIds = z
	.array(z.uuid('not a client id'))
	.min(1, 'at least one client')
	.max(MAX_PLAN_CLIENTS, `at most ${MAX_PLAN_CLIENTS} clients`)
	.refine(noDuplicates, 'duplicate clients');

export const planItemSchema = z.strictObject({
	exerciseId,
	reps: optionalText(60),
	notes: optionalText(500),
	swaps: z.record(z.uuid('not a client id'), exerciseId).default({})
});

const items = z
	.array(planItemSchema)
	.max(MAX_PLAN_ITEMS, `at most ${MAX_PLAN_ITEMS} exercises`)
	.refine((list) => noDuplicates(list.map((i) => i.exerciseId)), 'duplicate exercises');

const scheduledFor = z.iso
	.datetime({ offset: true, error: 'not a date and time' })
	.nullable()
	.optional();

export const planCreateSchema = z
	.strictObject({
		title: requiredText(200),
		scheduledFor,
		clientIds,
		exerciseIds: z
			.array(exerciseId)
			.max(MAX_PLAN_ITEMS, `at most ${MAX_PLAN_ITEMS} exercises`)
			.refine(noDuplicates, 'duplicate exercises')
			.optional(),
		items: items.optional()
	})
	.refine((v) => !(v.exerciseIds && v.items), {
		message: 'send exerciseIds or items, not both',
		path: ['items']
	});
export type PlanCreateInput = z.infer<typeof planCreateSchema>;

export const planPatchSchema = z.strictObject({
	version: z.number().int().min(1),
	title: requiredText(200).optional(),
	scheduledFor,
	clientIds: clientIds.optional(),
	items: items.optional(),
	archived: z.boolean().optional()
});
export type PlanPatchInput = z.infer<typeof planPatchSchema>;

export const readySchema = z.strictObject({
	override: z.strictObject({ reason: requiredText(1000) }).optional()
});

export const reviewRequestSchema = z.strictObject({
	exerciseId: exerciseId.optional(),
	note: requiredText(1000)
});

export const planListQuery = z.object({
	archived: z.enum(['true', 'false']).optional(),
	limit: z.coerce.number().int().min(1).max(100).default(25),
	cursor: text(500).optional()
});
