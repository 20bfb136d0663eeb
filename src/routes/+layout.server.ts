import { viewerOf } from '$lib/server/people/viewer';
import type { LayoutServerLoad } from './$types';

export const load: LayoutServerLoad = ({ locals }) => ({
	viewer: locals.actor ? viewerOf(locals.actor) : null
});
