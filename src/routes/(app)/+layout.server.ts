import { requirePageCaller } from '$lib/server/context';
import type { LayoutServerLoad } from './$types';

// hooks.server.ts already guards this group; loads and actions below check again.
export const load: LayoutServerLoad = ({ locals, url }) => {
	requirePageCaller(locals, url);
	return {};
};
