import type { Actor } from '../../actor';
import type { ReviewScope } from './scope';
import { activeMemberships } from '../../scope';

// Who may review the access log: an admin of the organisation she is acting in, over that
// organisation's scope (./scope.ts). Instructors, physiotherapists and clients may not (a
// client's view of her own accesses is a feature of its own). Pure; no I/O.

export interface Reviewer extends ReviewScope {
	organisationName: string;
}

/** Her review scope, or null when she may not review the log. */
export function reviewerOf(actor: Actor): Reviewer | null {
	const admin = activeMemberships(actor).find((m) => m.role === 'admin');
	if (!admin) return null;
	return {
		organisationId: admin.organisationId,
		organisationName: admin.organisationName,
		kind: admin.kind
	};
}
