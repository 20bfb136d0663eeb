import { SITES, siteLabelCapitalised } from '$lib/domain';
import { CLIENT_WORDS, clientField, consentFromForm } from '$lib/clients/form';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { combinedChartGeometry, siteChartGeometry } from '$lib/server/clients/chart';
import {
	assertMayWriteClient,
	examinerFactor,
	getClient,
	getScreeningHistory,
	inviteClientToSignIn,
	updateClient
} from '$lib/server/clients/service';
import { mayWriteClient } from '$lib/server/clients/policy';
import { listClientReferrals } from '$lib/server/referrals/for-client';
import { readClearance } from '$lib/server/clearance/clearance';
import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	const client = await forPage(getClient(caller, id));
	const [history, referrals, clearance] = await Promise.all([
		forPage(getScreeningHistory(caller, id)),
		forPage(listClientReferrals(caller, id)),
		forPage(readClearance(caller, id))
	]);
	const charts = SITES.map((site) => ({
		site,
		title: siteLabelCapitalised(site),
		chart: siteChartGeometry(history.series[site])
	}));
	return {
		client,
		history,
		referrals,
		clearance,
		charts,
		combined: combinedChartGeometry(history.series),
		mayWrite: mayWriteClient(caller.actor, client),
		// Her own factor for the table's mm estimates (display only, never a criterion).
		fingerFactor: await examinerFactor(caller)
	};
};

export const actions: Actions = {
	consent: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayWriteClient(caller, pageId(params.id)));
		const parsed = consentFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		try {
			await updateClient(caller, pageId(params.id), { intakeConsent: parsed.data });
		} catch (caught) {
			return failFromProblem(caught, parsed.values, { rename: clientField, words: CLIENT_WORDS });
		}
		return { consentRecorded: true };
	},
	invite: async ({ locals, url, params }) => {
		const caller = requirePageCaller(locals, url);
		try {
			const { sentTo } = await inviteClientToSignIn(caller, pageId(params.id));
			return { invitedTo: sentTo };
		} catch (caught) {
			return failFromProblem(caught);
		}
	}
};
