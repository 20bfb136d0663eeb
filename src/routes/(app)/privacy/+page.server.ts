import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import { pageQuery } from '$lib/server/http/schemas';
import { listOwnAccess } from '$lib/server/privacy/access';
import type { PageServerLoad } from './$types';

// The client's privacy page: who accessed her record, newest first. Later pages are links
// (`?cursor=`), so the list works without JavaScript.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const parsed = pageQuery.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : pageQuery.parse({});
	const access = await forPage(listOwnAccess(caller, query));
	return { access, restarted: !parsed.success };
};
