import { fail } from '@sveltejs/kit';
import { unsubscribeFromReminders } from '$lib/server/self-care/service';
import type { Actions, PageServerLoad } from './$types';

// Stopping the practice reminders from the mail's link, without signing in. The link only
// shows a button (so a mail scanner fetching it stops nothing); the button posts.
export const load: PageServerLoad = async ({ url }) => ({
	c: url.searchParams.get('c') ?? '',
	t: url.searchParams.get('t') ?? ''
});

export const actions: Actions = {
	default: async ({ request }) => {
		const form = await request.formData();
		const ok = await unsubscribeFromReminders(
			String(form.get('c') ?? ''),
			String(form.get('t') ?? '')
		);
		return ok ? { ok } : fail(400, { ok });
	}
};
