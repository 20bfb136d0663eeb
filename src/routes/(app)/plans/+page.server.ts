import { fail, redirect } from '@sveltejs/kit';
import { planCreateSchema } from '$lib/plans/schemas';
import { listClients } from '$lib/server/clients/service';
import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import { ProblemError } from '$lib/server/http/problem';
import { assertMayPlan, createPlan, duplicatePlan, listPlans } from '$lib/server/plans/service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const archived = url.searchParams.get('archived') === 'true';
	const [plans, roster] = await Promise.all([
		forPage(listPlans(caller, { archived: archived ? 'true' : 'false', limit: 100 })),
		forPage(listClients(caller, { sort: 'name', limit: 100 }))
	]);
	return { plans: plans.items, clients: roster.items, archived };
};

export const actions: Actions = {
	create: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayPlan(caller));
		const form = await request.formData();
		const values = {
			title: String(form.get('title') ?? ''),
			clientIds: form.getAll('clientIds').map(String)
		};
		const parsed = planCreateSchema.safeParse({ ...values, exerciseIds: [] });
		if (!parsed.success) {
			const errors: Record<string, string> = {};
			for (const issue of parsed.error.issues)
				errors[String(issue.path[0] ?? 'form')] ??= issue.message;
			return fail(400, { values, errors });
		}
		let id: string;
		try {
			({ id } = await createPlan(caller, parsed.data));
		} catch (caught) {
			if (!(caught instanceof ProblemError)) throw caught;
			return fail(caught.toResponse().status, { values, errors: { form: caught.init.detail } });
		}
		redirect(303, `/plans/${id}`);
	},
	duplicate: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayPlan(caller));
		const form = await request.formData();
		const { id } = await forPage(duplicatePlan(caller, pageId(String(form.get('planId') ?? ''))));
		redirect(303, `/plans/${id}`);
	}
};
