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
import { readAsOne } from '$lib/server/page-read';
import { clientSelfCare, setHomePractice } from '$lib/server/self-care/service';
import { homePracticeSchema } from '$lib/self-care/schemas';
import { ProblemError } from '$lib/server/http/problem';
import { fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	// Five services, one transaction and one access-log insert (see readAsOne).
	const read = await forPage(
		readAsOne(async () => {
			const client = await getClient(caller, id);
			const history = await getScreeningHistory(caller, id);
			const referrals = await listClientReferrals(caller, id);
			const clearance = await readClearance(caller, id);
			// Her home practice and, while she shares them, her self-checks: her studio's instructors.
			const mayWrite = mayWriteClient(caller.actor, client);
			const selfCare = mayWrite ? await clientSelfCare(caller, id) : null;
			// Her own factor for the table's mm estimates (display only, never a criterion).
			const fingerFactor = await examinerFactor(caller);
			return { client, history, referrals, clearance, selfCare, mayWrite, fingerFactor };
		})
	);
	const charts = SITES.map((site) => ({
		site,
		title: siteLabelCapitalised(site),
		chart: siteChartGeometry(read.history.series[site])
	}));
	return { ...read, charts, combined: combinedChartGeometry(read.history.series) };
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
	homePractice: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		await forPage(assertMayWriteClient(caller, id));
		const form = await request.formData();
		const ids = form.getAll('exerciseId').map(String);
		// The page's form always sends its rows; a form without them is not that form.
		if (ids.length === 0)
			return fail(400, { homePracticeError: 'Choose the exercises.', items: [] });
		const reps = form.getAll('reps').map(String);
		const notes = form.getAll('note').map(String);
		const items = ids
			.map((exerciseId, i) => ({ exerciseId, reps: reps[i] ?? '', note: notes[i] ?? '' }))
			.filter((item) => item.exerciseId !== '');
		const parsed = homePracticeSchema.safeParse({ items });
		if (!parsed.success) {
			return fail(400, { homePracticeError: 'Check the exercises, reps and notes.', items });
		}
		try {
			await setHomePractice(caller, id, parsed.data);
		} catch (caught) {
			if (caught instanceof ProblemError && caught.slug !== 'not-found') {
				return fail(caught.init.status ?? 409, { homePracticeError: caught.init.detail, items });
			}
			if (caught instanceof ProblemError) {
				return fail(400, { homePracticeError: caught.init.detail, items });
			}
			throw caught;
		}
		return { homePracticeSaved: true };
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
