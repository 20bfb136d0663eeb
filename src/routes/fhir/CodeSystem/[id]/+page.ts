import { error } from '@sveltejs/kit';
import type { PageLoad } from './$types';

// The canonical URL of Seamwell's own FHIR code system: a page saying what each code means.
export const load: PageLoad = ({ params }) => {
	if (params.id !== 'seamwell') error(404, 'No such code system');
	return {};
};
