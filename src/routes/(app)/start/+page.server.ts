import { redirect } from '@sveltejs/kit';
import { requirePageCaller } from '$lib/server/context';
import { areasOf } from '$lib/server/people/policy';
import { AREA_HOME } from '$lib/server/people/viewer';
import type { PageServerLoad } from './$types';

// Where signing in lands: the dashboard of the work she usually begins with.
export const load: PageServerLoad = ({ locals, url }) => {
	const { actor } = requirePageCaller(locals, url);
	const [first] = areasOf(actor);
	if (first) redirect(303, AREA_HOME[first]);
	return {};
};
