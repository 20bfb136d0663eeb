import { z } from 'zod';
import {
	FINGER_WIDTH_MAX,
	FINGER_WIDTH_MIN,
	isValidFingerWidth,
	RED_FLAGS,
	SITES
} from '../domain';
import { pastMoment } from '../clients/schemas';

// Input schemas for the client's self-check and home practice, shared by the JSON API and the
// screens (so this module stays free of server imports).

const fingers = z
	.number({
		error: (issue) => (issue.input === undefined ? 'required' : 'must be a number of finger widths')
	})
	.refine(
		isValidFingerWidth,
		`must be ${FINGER_WIDTH_MIN} to ${FINGER_WIDTH_MAX} finger widths in half steps`
	);

export const selfCheckSiteSchema = z.object({
	widthFingers: fingers,
	deep: z.boolean({ error: 'must be yes or no' }),
	doming: z.boolean({ error: 'must be yes or no' })
});

const siteShape = Object.fromEntries(SITES.map((site) => [site, selfCheckSiteSchema])) as Record<
	(typeof SITES)[number],
	typeof selfCheckSiteSchema
>;

export const selfCheckSitesSchema = z
	.object(siteShape, { error: 'must give all three places' })
	.strict()
	.transform((sites) => ({
		above_navel: sites.above_navel,
		at_navel: sites.at_navel,
		below_navel: sites.below_navel
	}));

export const symptomsSchema = z
	.array(z.enum(RED_FLAGS, { error: 'unknown symptom code' }), {
		error: 'must be a list of symptom codes'
	})
	.max(RED_FLAGS.length)
	.transform((codes) => [...new Set(codes)]);

export const selfCheckInputSchema = z.object({
	takenAt: pastMoment,
	sites: selfCheckSitesSchema.nullable().optional(),
	symptoms: symptomsSchema,
	/** After a caesarean: her answer, is the wound healed? Needed before the finger-width part. */
	woundHealed: z.boolean({ error: 'must be true or false' }).nullable().optional()
});
export type SelfCheckInputData = z.infer<typeof selfCheckInputSchema>;

export const selfCheckSharingSchema = z.object({
	studioId: z.uuid({ error: 'must be a studio id' }),
	share: z.boolean({ error: 'must be true or false' })
});

const optionalText = (max: number) =>
	z
		.string({ error: 'must be text' })
		.max(max, `at most ${max} characters`)
		.refine((s) => !s.includes('\u0000'), 'must not contain NUL characters')
		.transform((s) => s.trim() || null)
		.nullable()
		.optional()
		.transform((s) => s ?? null);

export const homePracticeSchema = z.object({
	items: z
		.array(
			z.object({
				exerciseId: z.string({ error: 'must be an exercise id' }).min(1, 'required').max(200),
				reps: optionalText(100),
				note: optionalText(1000)
			}),
			{ error: 'must be a list of exercises' }
		)
		.max(20, 'at most 20 exercises')
});
export type HomePracticeInput = z.infer<typeof homePracticeSchema>;

export const practiceSessionSchema = z
	.object({
		doneAt: pastMoment,
		feltOk: z.boolean({ error: 'must be true or false' }),
		note: optionalText(1000),
		symptoms: symptomsSchema.optional().transform((s) => s ?? [])
	})
	.refine((session) => !session.feltOk || session.symptoms.length === 0, {
		path: ['symptoms'],
		message: 'must be empty when the practice felt all right'
	});
export type PracticeSessionInput = z.infer<typeof practiceSessionSchema>;

export const practiceReminderSchema = z.object({
	on: z.boolean({ error: 'must be true or false' })
});

/** An instructor marks a dashboard follow-up done: which kind of item, and its id. */
export const followUpDoneSchema = z.strictObject({
	kind: z.enum(['self_check', 'felt_wrong'], { error: 'must be self_check or felt_wrong' }),
	id: z.uuid('must be the id of a self-check or a practice session')
});
