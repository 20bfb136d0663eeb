import { fail } from '@sveltejs/kit';
import { requirePageCaller } from '$lib/server/context';
import { failFromProblem } from '$lib/server/http/form';
import { forPage } from '$lib/server/http/page';
import { pageQuery } from '$lib/server/http/schemas';
import { listOwnAccess } from '$lib/server/privacy/access';
import { erasureOutlook, requestErasure } from '$lib/server/privacy/erasure';
import { mayReadOwnRecord } from '$lib/server/clients/policy';
import { notHere } from '$lib/server/referrals/not-here';
import type { Actions, PageServerLoad } from './$types';

// The client's privacy page: who accessed her record, newest first (later pages are links,
// `?cursor=`, so the list works without JavaScript), her data to take away, and her request
// that her studio erase it.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const parsed = pageQuery.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : pageQuery.parse({});
	const [access, erasure] = await Promise.all([
		forPage(listOwnAccess(caller, query)),
		erasureOutlook(caller)
	]);
	return { access, erasure, restarted: !parsed.success };
};

export const actions: Actions = {
	// One form, one confirmation box: asking is as plain as it is serious.
	erase: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		if (!mayReadOwnRecord(caller.actor)) {
			await notHere(caller, 'erasure.requested', { type: 'route', id: '/(app)/privacy' });
		}
		const form = await request.formData();
		const values = { understood: form.get('understood') === 'yes' ? 'yes' : '' };
		if (!values.understood) {
			return fail(400, {
				form: 'erase',
				values,
				errors: { understood: 'Tick the box to say you have read what will be erased.' }
			});
		}
		try {
			const created = await requestErasure(caller);
			return { form: 'erase', asked: created };
		} catch (caught) {
			return failFromProblem(caught, values, { form: 'erase' });
		}
	}
};
