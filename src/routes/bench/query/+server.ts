import { error, json } from '@sveltejs/kit';
import { benchBaselineQuery, benchEnabled } from '$lib/server/bench';
import { readId } from '$lib/server/http/api';
import type { RequestHandler } from './$types';

// The benchmark's second baseline (`npm run bench`): a bare SvelteKit endpoint in the real
// build, through the real hooks, doing the one indexed query the bare Node.js baseline does —
// so every route's figure can be read as a share of what the framework itself allows. It
// answers only when the bench started the app with SEAMWELL_BENCH=1; otherwise it is not there.
export const GET: RequestHandler = async ({ url }) => {
	if (!benchEnabled()) error(404, 'Not found');
	return json(await benchBaselineQuery(readId(url.searchParams.get('organisation') ?? '')));
};
