import { requirePageCaller } from '$lib/server/context';
import { forPage, pageId } from '$lib/server/http/page';
import { checkPlanById, exerciseLibrary, getPlan } from '$lib/server/plans/service';
import type { PageServerLoad } from './$types';

// The class sheet for the studio floor: first names, swaps and modification texts only —
// the page itself never receives reasons, sources or diagnoses.
export const load: PageServerLoad = async ({ locals, url, params }) => {
	const caller = requirePageCaller(locals, url);
	const id = pageId(params.id);
	const plan = await forPage(getPlan(caller, id));
	const [check, library] = await Promise.all([
		forPage(checkPlanById(caller, id)),
		forPage(exerciseLibrary(caller))
	]);
	const names = new Map(library.map((e) => [e.id, e.name]));
	const firstNames = new Map(plan.clients.map((c) => [c.id, c.firstName]));
	return {
		id: plan.id,
		title: plan.title,
		scheduledFor: plan.scheduledFor,
		ready: plan.readyAt !== null,
		clients: plan.clients.map((c) => c.firstName),
		items: plan.items.map((item, index) => ({
			name: names.get(item.exerciseId) ?? item.exerciseId,
			reps: item.reps ?? null,
			notes: item.notes ?? null,
			forClients: check.items
				.filter(
					(c) => c.itemIndex === index && (c.swapped || c.modification || c.status === 'blocked')
				)
				.map((c) => ({
					firstName: firstNames.get(c.clientId) ?? '',
					instead: c.swapped ? (names.get(c.checkedExerciseId) ?? null) : null,
					modification: c.modification ?? null,
					// Blocked and not swapped: she sits this one out (no reason on the sheet).
					sitOut: c.status === 'blocked' && !c.overridden
				}))
		}))
	};
};
