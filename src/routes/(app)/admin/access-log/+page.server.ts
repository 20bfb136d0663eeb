import { fail } from '@sveltejs/kit';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { ProblemError } from '$lib/server/http/problem';
import { summariseActivity, verifyAccessLog } from '$lib/server/audit/review/service';
import { listMembers } from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

// The admin's access log: the week's summary and the filter's choices come from here; the
// events themselves are loaded by `+page.ts` from /api/v1/audit, like every list page's.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const [members, summary] = await forPage(() =>
		Promise.all([listMembers(caller), summariseActivity(caller, 1)])
	);
	return {
		// One row per membership: a person who is both admin and instructor is listed once.
		members: [
			...new Map(
				members.members.map((m) => [m.userId, { userId: m.userId, name: m.name ?? m.email }])
			)
		].map(([, m]) => m),
		organisationName: members.organisationName,
		summary
	};
};

export const actions: Actions = {
	verify: async ({ locals, url }) => {
		const caller = requirePageCaller(locals, url);
		try {
			return { verified: await verifyAccessLog(caller) };
		} catch (error) {
			if (error instanceof ProblemError) {
				return fail(error.init.status ?? 500, { verifyProblem: error.init.detail });
			}
			throw error;
		}
	}
};
