import { fail } from '@sveltejs/kit';
import { z } from 'zod';
import { chartSeries, SITES } from '$lib/domain';
import { transitionFromForm } from '$lib/referrals/form';
import { consentRequestSchema } from '$lib/referrals/schemas';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { siteChartGeometry } from '$lib/server/clients/chart';
import { requestConsent } from '$lib/server/consents/service';
import { requirePageCaller } from '$lib/server/context';
import { formDone } from '$lib/server/http/form';
import { forPage, pageId } from '$lib/server/http/page';
import { readAsOne } from '$lib/server/page-read';
import { documentPatchSchema, readUploadForm } from '$lib/server/documents/schemas';
import { getDocumentPanel, updateDocument, uploadDocument } from '$lib/server/documents/service';
import { ProblemError } from '$lib/server/http/problem';
import { getReferral, listLiveScreenings, transitionReferral } from '$lib/server/referrals/service';
import { assessmentFromForm, clearanceFromForm } from '$lib/clearance/form';
import {
	assertClinicForms,
	readAssessment,
	recordAssessment
} from '$lib/server/clearance/assessment';
import { readClearance, setClearance } from '$lib/server/clearance/clearance';
import { ASSESSABLE_STATES } from '$lib/server/clearance/policy';
import type { Actions, PageServerLoad } from './$types';

/** The document panel's forms answer under this name. */
const DOCUMENTS = { form: 'documents' } as const;

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	// Its services in one transaction with one access-log insert (see readAsOne).
	const read = await forPage(
		readAsOne(async () => {
			const referral = await getReferral(caller, id);
			// The clinic sees her live history only while her consent lasts; the page asks only
			// then, so a plain view after sharing ended leaves no refusal in the log.
			const live =
				referral.viewer === 'clinic' && referral.sharing.screeningsLive
					? (await listLiveScreenings(caller, id, { limit: 100 })).items
					: null;
			const documents = await getDocumentPanel(caller, id);
			// The clinic's own findings and the client's clearance, for its physiotherapists.
			const clinicSide = referral.viewer === 'clinic' && referral.state !== 'draft';
			const assessment = clinicSide ? await readAssessment(caller, id) : null;
			const clearance =
				clinicSide && referral.clientId ? await readClearance(caller, referral.clientId) : null;
			return { referral, live, documents, assessment, clearance, clinicSide };
		})
	);
	const { referral, live, clinicSide } = read;
	const series = chartSeries(live ?? referral.screenings);
	const charts = SITES.map((site) => ({ site, chart: siteChartGeometry(series[site]) }));
	const assigned = referral.physioId === caller.actor.userId;
	// A referral whose studio erased the client's record is kept to be read, not worked on.
	const mayAct =
		clinicSide &&
		assigned &&
		referral.clientId !== null &&
		ASSESSABLE_STATES.includes(referral.state);
	return {
		referral,
		live,
		charts,
		documents: read.documents,
		assessment: read.assessment,
		clearance: read.clearance,
		mayAssess: mayAct && referral.sharing.status === 'active',
		mayClear: mayAct
	};
};

export const actions: Actions = {
	assess: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		await forPage(assertClinicForms(caller, id));
		const parsed = assessmentFromForm(await request.formData());
		if (!parsed.ok) {
			return fail(400, { assessment: { values: parsed.values, errors: parsed.errors } });
		}
		try {
			await recordAssessment(caller, id, parsed.data);
			return { assessed: true };
		} catch (caught) {
			const failed = failFromProblem(caught, parsed.values);
			return fail(failed.status, { assessment: failed.data });
		}
	},
	clear: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		await forPage(assertClinicForms(caller, id));
		const form = await request.formData();
		// The hernia finding the form asked her to confirm against: the latest one she recorded.
		const hernia = await readAssessment(caller, id)
			.then((a) => a.current?.hernia ?? null)
			.catch(() => null);
		const parsed = clearanceFromForm(form, hernia);
		if (!parsed.ok) {
			return fail(400, { clearance: { values: parsed.values, errors: parsed.errors } });
		}
		const clientId = z.uuid().safeParse(form.get('clientId'));
		if (!clientId.success) {
			return fail(400, {
				clearance: {
					values: parsed.values,
					errors: { form: 'The form lost its client; reload the page.' }
				}
			});
		}
		try {
			await setClearance(caller, clientId.data, { ...parsed.data, referralId: id });
			return { cleared: true };
		} catch (caught) {
			const failed = failFromProblem(caught, parsed.values, {
				rename: (field) =>
					field.replace(/^categories\./, 'level.').replace(/^modifications\./, 'mod.')
			});
			return fail(failed.status, { clearance: failed.data });
		}
	},
	transition: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		const parsed = transitionFromForm(await request.formData());
		if (!parsed.ok) return failForm(parsed.values, parsed.errors);
		try {
			const moved = await transitionReferral(caller, id, parsed.data);
			return { moved: moved.state };
		} catch (caught) {
			if (caught instanceof ProblemError && caught.slug === 'consent-required') {
				return fail(409, {
					values: parsed.values,
					errors: { form: caught.init.detail },
					consentRequired: Boolean(caught.init.requestConsent)
				});
			}
			return failFromProblem(caught, parsed.values);
		}
	},
	requestConsent: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const parsed = consentRequestSchema.safeParse({
			clientId: form.get('clientId'),
			clinicId: form.get('clinicId')
		});
		if (!parsed.success) return failForm({}, { form: 'Missing client or clinic.' });
		try {
			await requestConsent(caller, parsed.data);
		} catch (caught) {
			return failFromProblem(caught);
		}
		return { requested: true };
	},
	// Without JavaScript the upload is this plain multipart form; with it, the page sends the
	// same form to POST /api/v1/referrals/{id}/documents to show the upload's progress.
	upload: async ({ locals, url, params, request }) => {
		const caller = requirePageCaller(locals, url);
		const id = pageId(params.id);
		const parsed = await readUploadForm(await request.formData());
		if (!parsed.ok) {
			return failForm({}, { form: 'Choose a PDF file to upload. Nothing was saved.' }, DOCUMENTS);
		}
		try {
			await uploadDocument(caller, id, parsed.data);
		} catch (caught) {
			return failFromProblem(caught, {}, DOCUMENTS);
		}
		return formDone(`Uploaded ${parsed.data.fileName}.`, 'documents');
	},
	updateDocument: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const documentId = z.uuid().safeParse(form.get('documentId'));
		const patch = documentPatchSchema.safeParse({
			share: form.get('share') ?? undefined,
			summary: form.get('summary') ?? undefined
		});
		if (!patch.success || !documentId.success) {
			return failForm({}, { form: 'Choose how to share the document.' }, DOCUMENTS);
		}
		try {
			const updated = await updateDocument(caller, documentId.data, patch.data);
			return formDone(`Saved the changes to ${updated.name}.`, 'documents');
		} catch (caught) {
			return failFromProblem(caught, {}, DOCUMENTS);
		}
	}
};
