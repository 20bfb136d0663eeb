import { error, redirect } from '@sveltejs/kit';
import { CLIENT_WORDS, clientEditFromForm, clientField } from '$lib/clients/form';
import type { FormValues } from '$lib/forms';
import type { ClientDetail } from '$lib/clients/types';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { mayWriteClient } from '$lib/server/clients/policy';
import { assertMayWriteClient, getClient, updateClient } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import type { Actions, PageServerLoad } from './$types';

function valuesOf(client: ClientDetail): FormValues {
	const yesNo = (value: boolean | null) => (value === null ? '' : value ? 'yes' : 'no');
	return {
		name: client.name,
		email: client.email ?? '',
		birthYear: client.birthYear?.toString() ?? '',
		stage: client.stage,
		dueDate: client.dueDate ?? '',
		birthDate: client.birthDate ?? '',
		delivery: client.delivery ?? '',
		births: client.births?.toString() ?? '',
		multiples: client.multiples ? 'yes' : '',
		postnatalCheckOn: client.postnatalCheckOn ?? '',
		postnatalCleared: yesNo(client.postnatalCleared),
		notes: client.notes ?? ''
	};
}

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const client = await forPage(getClient(caller, pageId(params.id)));
	if (!mayWriteClient(caller.actor, client)) error(404, 'Not found');
	return { client, values: valuesOf(client) };
};

export const actions: Actions = {
	default: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		await forPage(assertMayWriteClient(caller, id));
		const parsed = clientEditFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		try {
			await updateClient(caller, id, parsed.body);
		} catch (caught) {
			return failFromProblem(caught, parsed.values, { rename: clientField, words: CLIENT_WORDS });
		}
		redirect(303, `/clients/${id}`);
	}
};
