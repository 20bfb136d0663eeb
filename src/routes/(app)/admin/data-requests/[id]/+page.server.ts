import { erasureDecisionSchema } from '$lib/privacy/schemas';
import { requirePageCaller } from '$lib/server/context';
import { failFromProblem, failForm } from '$lib/server/http/form';
import { forPage, pageId } from '$lib/server/http/page';
import {
	decideErasure,
	getErasureRequest,
	visibleErasureRequest
} from '$lib/server/privacy/erasure';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	return await forPage(getErasureRequest(caller, pageId(params.id)));
};

async function decide(
	{ locals, url, params, request }: Parameters<Actions[string]>[0],
	decision: 'approve' | 'decline'
) {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id!);
	// Another studio's request (or none): the designed 404, before the form is read.
	await forPage(visibleErasureRequest(caller, id, 'erasure.read'));
	const form = await request.formData();
	const values = {
		reason: String(form.get('reason') ?? ''),
		understood: form.get('understood') === 'yes' ? 'yes' : ''
	};
	if (decision === 'approve' && !values.understood) {
		return failForm(
			values,
			{ understood: 'Tick the box to confirm: erasing cannot be undone.' },
			{
				form: decision
			}
		);
	}
	const parsed = erasureDecisionSchema.safeParse({ decision, reason: values.reason });
	if (!parsed.success) {
		const issue = parsed.error.issues.find((i) => i.path[0] === 'reason');
		const reason =
			!issue || issue.message === 'required when declining'
				? 'Write the reason: the client reads it.'
				: `The reason: ${issue.message}.`;
		return failForm(values, { reason }, { form: decision });
	}
	try {
		await decideErasure(caller, id, parsed.data);
	} catch (caught) {
		return failFromProblem(caught, values, { form: decision });
	}
	return { form: decision, done: true };
}

export const actions: Actions = {
	approve: (event) => decide(event, 'approve'),
	decline: (event) => decide(event, 'decline')
};
