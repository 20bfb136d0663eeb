import type { PageLoad } from './$types';

// The physiotherapist's part of the page (her findings, the assessment and clearance forms) is
// shown only on the clinic's side, so only that view loads its code; the studio's never does.
// This load runs on the server for the first render and again in the browser before hydration,
// so both render the same page, and without JavaScript the server's HTML has everything.
export const load: PageLoad = async ({ data }) => ({
	...data,
	ClinicFindings: data.assessment ? (await import('./ClinicFindings.svelte')).default : null
});
