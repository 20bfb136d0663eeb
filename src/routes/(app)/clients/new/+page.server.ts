import { redirect } from '@sveltejs/kit';
import { CLIENT_WORDS, clientField, clientFromForm } from '$lib/clients/form';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { assertMayKeepClients, createClient } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage } from '$lib/server/http/page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	await forPage(assertMayKeepClients(requirePageCaller(locals, url)));
	return {};
};

export const actions: Actions = {
	default: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayKeepClients(caller));
		const parsed = clientFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		let id: string;
		try {
			({ id } = await createClient(caller, parsed.data));
		} catch (caught) {
			return failFromProblem(caught, parsed.values, { rename: clientField, words: CLIENT_WORDS });
		}
		redirect(303, `/clients/${id}`);
	}
};
