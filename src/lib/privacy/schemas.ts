import { z } from 'zod';
import { nullableText } from '../schemas/text';

// The studio admin's answer to a request to erase a client's data (browser-safe: the form and
// the JSON API read it with the same schema).

export const ERASURE_STATES = ['open', 'approved', 'declined'] as const;

export const erasureDecisionSchema = z
	.strictObject({
		decision: z.enum(['approve', 'decline'], { error: 'must be approve or decline' }),
		reason: nullableText(2000)
	})
	.superRefine((value, ctx) => {
		if (value.decision === 'decline' && !value.reason) {
			ctx.addIssue({ code: 'custom', path: ['reason'], message: 'required when declining' });
		}
	});
export type ErasureDecision = z.infer<typeof erasureDecisionSchema>;

export const erasureListQuery = z.strictObject({
	state: z.enum(ERASURE_STATES, { error: 'must be open, approved or declined' }).optional()
});
