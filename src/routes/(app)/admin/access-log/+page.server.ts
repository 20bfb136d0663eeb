import { fail } from '@sveltejs/kit';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { fieldErrors, ProblemError } from '$lib/server/http/problem';
import { reviewQuery } from '$lib/server/audit/review/filters';
import {
	listAccessEvents,
	summariseActivity,
	verifyAccessLog
} from '$lib/server/audit/review/service';
import { listMembers } from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

// The admin's access log: the first page is rendered here (it works without JavaScript); the
// browser fetches later pages from /api/v1/audit with the same filters, which live in the URL.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const parsed = reviewQuery.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : reviewQuery.parse({});
	const errors = parsed.success ? [] : fieldErrors(parsed.error);
	const [page, members, summary] = await forPage(() =>
		Promise.all([
			parsed.success ? listAccessEvents(caller, query) : { items: [], nextCursor: null },
			listMembers(caller),
			summariseActivity(caller, 1)
		])
	);
	return {
		page,
		errors,
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
