import { redirect } from '@sveltejs/kit';
import { z } from 'zod';
import { DEFAULT_MM_PER_FINGER } from '$lib/domain';
import { requirePageCaller } from '$lib/server/context';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { ORGANISATION_COOKIE } from '$lib/server/people/sessions';
import {
	chooseOrganisation,
	describeMe,
	FINGER_FACTOR_MAX,
	FINGER_FACTOR_MIN,
	getFingerFactor,
	setFingerFactor
} from '$lib/server/people/service';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	return {
		me: describeMe(caller),
		activeOrganisationId: caller.actor.activeOrganisationId,
		fingerFactor: {
			own: await getFingerFactor(caller),
			default: DEFAULT_MM_PER_FINGER,
			min: FINGER_FACTOR_MIN,
			max: FINGER_FACTOR_MAX
		}
	};
};

const switchForm = z.object({ organisationId: z.uuid('Choose an organisation.') });

const factorMessage = `Enter ${FINGER_FACTOR_MIN} to ${FINGER_FACTOR_MAX} mm, or leave it empty for the default.`;

/**
 * Millimetres per finger width: empty means the default; a comma works as the decimal mark;
 * kept to one decimal. A form without the field at all is not this page's form: 400.
 */
const factorForm = z.object({
	mmPerFinger: z
		.string({ error: factorMessage })
		.trim()
		.max(20, factorMessage)
		.transform((s) => (s === '' ? null : Math.round(Number(s.replace(',', '.')) * 10) / 10))
		.pipe(
			z
				.number({ error: factorMessage })
				.min(FINGER_FACTOR_MIN, factorMessage)
				.max(FINGER_FACTOR_MAX, factorMessage)
				.nullable()
		)
});

export const actions: Actions = {
	// Chooses the organisation she acts in; the cookie is checked against her memberships on every request.
	switch: async ({ locals, url, request, cookies }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const values = { organisationId: String(form.get('organisationId') ?? '') };
		const parsed = switchForm.safeParse(values);
		if (!parsed.success) {
			return failForm(values, { organisationId: 'Choose an organisation.' }, { form: 'switch' });
		}
		let organisationId: string;
		try {
			organisationId = chooseOrganisation(caller, parsed.data.organisationId);
		} catch (e) {
			return failFromProblem(e, values, { form: 'switch' });
		}
		cookies.set(ORGANISATION_COOKIE, organisationId, {
			path: '/',
			httpOnly: true,
			sameSite: 'lax',
			secure: url.protocol === 'https:',
			maxAge: 60 * 60 * 24 * 365
		});
		redirect(303, '/start');
	},
	// Her own millimetres per finger width for mm estimates; empty goes back to the default.
	factor: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		const form = await request.formData();
		const raw = form.get('mmPerFinger');
		const values = { mmPerFinger: typeof raw === 'string' ? raw : '' };
		const parsed = factorForm.safeParse({ mmPerFinger: raw ?? undefined });
		if (!parsed.success) {
			return failForm(values, { mmPerFinger: factorMessage }, { form: 'factor' });
		}
		try {
			const saved = await setFingerFactor(caller, parsed.data.mmPerFinger);
			return { factorSaved: true, mmPerFinger: saved };
		} catch (e) {
			return failFromProblem(e, values, { form: 'factor' });
		}
	}
};
