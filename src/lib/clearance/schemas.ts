import { z } from 'zod';
import { requiredText, nullableText } from '$lib/schemas/text';
import { CLEARANCE_LEVELS, MOVEMENT_CATEGORIES, type MovementCategory } from '$lib/domain/movement';
import { HERNIA_FINDINGS, MEASUREMENT_METHODS, MEASUREMENT_POSITIONS } from './types';
import { REVIEW_MAX_WEEKS, reviewWindow } from './review-window';

export { REVIEW_MAX_WEEKS, reviewWindow };

// Input schemas for assessments and clearances, shared by the JSON API, the form actions and
// the browser (so this module stays free of server imports).

export const MM_MAX = 150;
export const DISTANCE_MAX_CM = 15;

const mm = z
	.number({ error: 'must be a number of millimetres' })
	.min(0, `must be 0–${MM_MAX} mm`)
	.max(MM_MAX, `must be 0–${MM_MAX} mm`)
	.nullable()
	.optional()
	.transform((v) => v ?? null);

export const assessmentPointSchema = z
	.object({
		position: z.enum(MEASUREMENT_POSITIONS, {
			error: `must be one of ${MEASUREMENT_POSITIONS.join(', ')}`
		}),
		distanceCm: z
			.number({ error: 'must be a number of centimetres' })
			.min(0, `must be 0–${DISTANCE_MAX_CM} cm`)
			.max(DISTANCE_MAX_CM, `must be 0–${DISTANCE_MAX_CM} cm`)
			.nullable()
			.optional()
			.transform((v) => v ?? null),
		restMm: mm,
		curlUpMm: mm,
		method: z.enum(MEASUREMENT_METHODS, {
			error: `must be one of ${MEASUREMENT_METHODS.join(', ')}`
		}),
		depth: z
			.enum(['shallow', 'moderate', 'deep'], { error: 'must be shallow, moderate or deep' })
			.nullable()
			.optional()
			.transform((v) => v ?? null),
		tension: z
			.enum(['firm', 'soft'], { error: 'must be firm or soft' })
			.nullable()
			.optional()
			.transform((v) => v ?? null),
		doming: z
			.boolean({ error: 'must be true or false' })
			.nullable()
			.optional()
			.transform((v) => v ?? null)
	})
	.superRefine((p, ctx) => {
		if (p.restMm === null && p.curlUpMm === null) {
			ctx.addIssue({
				code: 'custom',
				path: ['restMm'],
				message: 'give the width at rest, during a curl-up, or both'
			});
		}
		if (p.position === 'xiphoid' && p.distanceCm !== null) {
			ctx.addIssue({
				code: 'custom',
				path: ['distanceCm'],
				message: 'no distance at the xiphoid (it is its own landmark)'
			});
		}
		if (p.position === 'at' && p.distanceCm !== null && p.distanceCm !== 0) {
			ctx.addIssue({
				code: 'custom',
				path: ['distanceCm'],
				message: 'a point at the navel has no distance from it'
			});
		}
		if ((p.position === 'above' || p.position === 'below') && !p.distanceCm) {
			ctx.addIssue({
				code: 'custom',
				path: ['distanceCm'],
				message: `give the distance ${p.position} the navel (more than 0, up to ${DISTANCE_MAX_CM} cm)`
			});
		}
	});
export type AssessmentPointInput = z.infer<typeof assessmentPointSchema>;

/** POST /api/v1/referrals/{id}/assessment and the assessment form. */
export const assessmentSchema = z.object({
	points: z
		.array(assessmentPointSchema, { error: 'must be a list of measurement points' })
		.min(1, 'record at least one measurement point')
		.max(12, 'at most 12 measurement points'),
	hernia: z.enum(HERNIA_FINDINGS, { error: `must be one of ${HERNIA_FINDINGS.join(', ')}` }),
	pelvicFloor: nullableText(4000),
	plan: requiredText(4000)
});
export type AssessmentData = z.infer<typeof assessmentSchema>;

const levelSchema = z.enum(CLEARANCE_LEVELS, {
	error: `must be one of ${CLEARANCE_LEVELS.join(', ')}`
});

/** POST /api/v1/clients/{id}/clearance and the clearance form. */
export const clearanceSchema = z
	.object({
		referralId: z.uuid({ error: 'must be a referral id' }).nullable().optional(),
		categories: z.strictObject(
			Object.fromEntries(MOVEMENT_CATEGORIES.map((c) => [c, levelSchema])) as Record<
				MovementCategory,
				typeof levelSchema
			>,
			{ error: 'must give a level for each of the nine movement categories' }
		),
		modifications: z
			.strictObject(
				Object.fromEntries(
					MOVEMENT_CATEGORIES.map((c) => [c, requiredText(1000).optional()])
				) as Record<MovementCategory, z.ZodOptional<ReturnType<typeof requiredText>>>,
				{ error: 'must be an object of movement category → text' }
			)
			.optional()
			.transform((m) => m ?? {}),
		notes: nullableText(4000),
		reviewOn: z.iso.date({ error: 'must be a date (YYYY-MM-DD)' })
	})
	.superRefine((c, ctx) => {
		for (const category of MOVEMENT_CATEGORIES) {
			const written = c.modifications[category];
			if (c.categories[category] === 'modify' && !written) {
				ctx.addIssue({
					code: 'custom',
					path: ['modifications', category],
					message: 'write the modification for a category you marked modify'
				});
			}
			if (c.categories[category] !== 'modify' && written) {
				ctx.addIssue({
					code: 'custom',
					path: ['modifications', category],
					message: 'a modification belongs only to a category marked modify'
				});
			}
		}
		const { first, last } = reviewWindow();
		if (/^\d{4}-\d{2}-\d{2}$/.test(c.reviewOn) && (c.reviewOn < first || c.reviewOn > last)) {
			ctx.addIssue({
				code: 'custom',
				path: ['reviewOn'],
				message: `must be from tomorrow (${first}) to ${REVIEW_MAX_WEEKS} weeks ahead (${last})`
			});
		}
	});
export type ClearanceData = z.infer<typeof clearanceSchema>;
