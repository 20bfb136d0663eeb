import type { RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { requirePageCaller } from '$lib/server/context';
import { issuesToFormErrors } from '$lib/forms';
import { failForm, failFromProblem, formDone } from '$lib/server/http/form';
import { forPage } from '$lib/server/http/page';
import {
	changeRoleForm,
	deactivateForm,
	inviteForm,
	revokeForm
} from '$lib/server/people/member-forms';
import {
	changeMemberRole,
	deactivateMember,
	inviteMember,
	listMembers,
	revokeInvitation
} from '$lib/server/people/service';
import type { Caller } from '$lib/server/context';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return { list: await forPage(listMembers(caller)) };
};

/** Parses the form with its schema, then runs the service; answers fail(…) on bad input or refusal. */
async function run<S extends z.ZodType>(
	event: RequestEvent,
	form: string,
	schema: S,
	work: (caller: Caller, input: z.infer<S>) => Promise<unknown>,
	done: string
) {
	const caller = requirePageCaller(event.locals, event.url);
	const values = Object.fromEntries(
		[...(await event.request.formData())].map(([k, v]) => [k, String(v).slice(0, 300)])
	);
	const parsed = schema.safeParse(values);
	if (!parsed.success) {
		return failForm(values, issuesToFormErrors(parsed.error.issues), { form });
	}
	try {
		await work(caller, parsed.data);
	} catch (e) {
		return failFromProblem(e, values, { form });
	}
	return formDone(done, form);
}

export const actions: Actions = {
	invite: (event) =>
		run(event, 'invite', inviteForm, (c, input) => inviteMember(c, input), 'Invitation sent.'),
	revoke: (event) =>
		run(
			event,
			'revoke',
			revokeForm,
			(c, input) => revokeInvitation(c, input.invitationId),
			'Invitation revoked.'
		),
	changeRole: (event) =>
		run(
			event,
			'changeRole',
			changeRoleForm,
			(c, input) => changeMemberRole(c, input),
			'Role changed.'
		),
	deactivate: (event) =>
		run(
			event,
			'deactivate',
			deactivateForm,
			(c, input) => deactivateMember(c, input.membershipId),
			'Member deactivated; their sessions have ended.'
		)
};
