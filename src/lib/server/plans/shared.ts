import { type AuditAction } from '../audit';
import { refuse, type Caller } from '../context';
import { clients, plans } from '../db/schema';
import { notFound, ProblemError } from '../http/problem';
import { mayUsePlans } from './policy';

// What the plan modules (library, content, edit, check, review requests, the client's view)
// share: row types, days, first names and the refusal for anyone who may not plan.

export type PlanRow = typeof plans.$inferSelect;
export type ClientRow = typeof clients.$inferSelect;

export const todayUtc = () => new Date().toISOString().slice(0, 10);
export const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name;

export async function refuseUse(caller: Caller, action: AuditAction): Promise<never> {
	return refuse(
		caller,
		action,
		new ProblemError('forbidden', {
			detail: 'Exercises and session plans are kept by the instructors of a studio.'
		})
	);
}

/**
 * Policy: mayUsePlans. Audit: a refusal only. For form actions, which check policy before they
 * read the form, so a person without access gets 404 rather than the form's 400.
 */
export async function assertMayPlan(caller: Caller): Promise<void> {
	if (!mayUsePlans(caller.actor)) await refuse(caller, 'access.denied', notFound());
}
