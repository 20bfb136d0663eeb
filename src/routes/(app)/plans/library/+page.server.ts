import { redirect } from '@sveltejs/kit';
import { formValues } from '$lib/forms';
import { EXERCISE_LISTS, exerciseFromForm } from '$lib/plans/exercise-form';
import { exerciseQuerySchema } from '$lib/plans/schemas';
import { requirePageCaller } from '$lib/server/context';
import { failForm, failFromProblem } from '$lib/server/http/form';
import { forPage } from '$lib/server/http/page';
import { assertMayPlan, createExercise, exerciseLibrary } from '$lib/server/plans/service';
import type { Actions, PageServerLoad } from './$types';

// The studio's exercise library: every shipped exercise and the studio's own, filtered by a GET
// form (works without JavaScript); her studio may add its own or copy a shipped one to adapt.
export const load: PageServerLoad = async ({ locals, url }) => {
	const caller = requirePageCaller(locals, url);
	const library = await forPage(exerciseLibrary(caller));
	const parsed = exerciseQuerySchema.safeParse(Object.fromEntries(url.searchParams));
	const query = parsed.success ? parsed.data : exerciseQuerySchema.parse({});
	const q = query.q?.trim().toLowerCase();
	const shown = library.filter(
		(e) =>
			(!query.category || e.categories.includes(query.category)) &&
			(!query.position || e.position === query.position) &&
			(!query.difficulty || e.difficulty === query.difficulty) &&
			(!q || e.name.toLowerCase().includes(q) || e.description.toLowerCase().includes(q))
	);
	const copyId = url.searchParams.get('copy');
	const copyOf = copyId ? (library.find((e) => e.id === copyId) ?? null) : null;
	return {
		library: library.map((e) => ({ id: e.id, name: e.name })),
		shown,
		total: library.length,
		copyOf,
		badFilter: !parsed.success
	};
};

export const actions: Actions = {
	create: async ({ locals, url, request }) => {
		const caller = requirePageCaller(locals, url);
		await forPage(assertMayPlan(caller));
		const values = formValues(await request.formData(), EXERCISE_LISTS);
		const parsed = exerciseFromForm(values);
		if (!parsed.ok) return failForm(values, parsed.errors);
		let id: string;
		try {
			({ id } = await createExercise(caller, parsed.data));
		} catch (caught) {
			return failFromProblem(caught, values);
		}
		redirect(303, `/plans/library?added=${encodeURIComponent(id)}#exercise-${id}`);
	}
};
