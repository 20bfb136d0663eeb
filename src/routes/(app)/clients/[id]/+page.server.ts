import { error, fail } from '@sveltejs/kit';
import { SITES, siteLabelCapitalised } from '$lib/domain';
import { consentFromForm } from '$lib/clients/form';
import { failFromProblem, orNotFound } from '$lib/server/clients/actions';
import { siteChartGeometry } from '$lib/server/clients/chart';
import {
	assertMayWriteClient,
	getClient,
	getScreeningHistory,
	inviteClientToSignIn,
	updateClient
} from '$lib/server/clients/service';
import { mayWriteClient } from '$lib/server/clients/policy';
import { requirePageCaller } from '$lib/server/context';
import { readId } from '$lib/server/http/api';
import type { Actions, PageServerLoad } from './$types';

function idOf(value: string): string {
	try {
		return readId(value);
	} catch {
		error(404, 'Not found');
	}
}

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = idOf(params.id);
	const client = await orNotFound(getClient(caller, id));
	const history = await orNotFound(getScreeningHistory(caller, id));
	const charts = SITES.map((site) => ({
		site,
		title: siteLabelCapitalised(site),
		chart: siteChartGeometry(history.series[site])
	}));
	return { client, history, charts, mayWrite: mayWriteClient(caller.actor, client) };
};

export const actions: Actions = {
	consent: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		await orNotFound(assertMayWriteClient(caller, idOf(params.id)));
		const parsed = consentFromForm(await request.formData());
		if (!parsed.ok) return fail(400, { values: parsed.values, errors: parsed.errors });
		try {
			await updateClient(caller, idOf(params.id), { intakeConsent: parsed.data });
		} catch (caught) {
			return failFromProblem(caught, parsed.values);
		}
		return { consentRecorded: true };
	},
	invite: async ({ locals, url, params }) => {
		const caller = requirePageCaller(locals, url);
		try {
			const { sentTo } = await inviteClientToSignIn(caller, idOf(params.id));
			return { invitedTo: sentTo };
		} catch (caught) {
			return failFromProblem(caught, {});
		}
	}
};
