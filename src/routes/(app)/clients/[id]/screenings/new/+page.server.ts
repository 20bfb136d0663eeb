import { error } from '@sveltejs/kit';
import { earlyScreenWarnings, redFlagsForStage, SITES, type Site } from '$lib/domain';
import { SCREENING_WORDS, screeningField, screeningFromForm } from '$lib/clients/form';
import { readClearance } from '$lib/server/clearance/clearance';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { mayWriteClient } from '$lib/server/clients/policy';
import { stageContextAt } from '$lib/server/clients/screening-record';
import {
	assertMayWriteClient,
	examinerFactor,
	getClient,
	recordScreening
} from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const client = await forPage(getClient(caller, pageId(params.id)));
	if (!mayWriteClient(caller.actor, client)) error(404, 'Not found');
	let warnings: ReturnType<typeof earlyScreenWarnings>;
	try {
		warnings = earlyScreenWarnings(stageContextAt(client, new Date()));
	} catch {
		warnings = [];
	}
	return {
		client,
		redFlags: redFlagsForStage(client.stage),
		warnings,
		// Her own factor for the result's mm estimates (display only, never a criterion).
		fingerFactor: await examinerFactor(caller),
		// An earlier sign sent her to a doctor: ask whether she was seen and it has gone.
		askMedicalResolved: (await readClearance(caller, client.id)).seeDoctorFirst
	};
};

export const actions: Actions = {
	default: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayWriteClient(caller, pageId(params.id)));
		const parsed = screeningFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		try {
			const result = await recordScreening(caller, pageId(params.id), parsed.data);
			// The widths as recorded, for the result's finger widths and their mm estimates.
			const widths = Object.fromEntries(
				SITES.map((site) => [site, parsed.data.sites[site].widthFingers])
			) as Record<Site, number>;
			return { result, widths };
		} catch (caught) {
			return failFromProblem(caught, parsed.values, {
				rename: screeningField,
				words: SCREENING_WORDS
			});
		}
	}
};
