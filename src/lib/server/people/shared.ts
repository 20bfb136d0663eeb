import { recordRefusal, type AccessContext } from '../audit';
import type { Caller } from '../context';
import { notFound } from '../http/problem';

// Organisations, memberships and invitations. Every exported function begins by asserting
// its policy rule (./policy.ts) and names it, with its access-log action, in one line.

export const INVITATION_DAYS = 7;

export const asAdmin = (caller: Caller, organisationId: string): AccessContext => ({
	...caller.access,
	role: 'admin',
	organisationId
});

/** Refuses with a 404 and records the refusal. */
export async function refuse(caller: Caller, target: { type: string; id: string }): Promise<never> {
	await recordRefusal(caller.access, { action: 'access.denied', target });
	throw notFound();
}
