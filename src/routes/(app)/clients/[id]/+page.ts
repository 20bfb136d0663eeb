import { browser } from '$app/environment';
import type { PageLoad } from './$types';

// Parts of the page that most visits do not show load only when they do. This load runs on the
// server for the first render and again in the browser before hydration, so both render the
// same page; without JavaScript the server's HTML has everything.
export const load: PageLoad = async ({ data }) => ({
	...data,
	// Her intake consent is recorded once; the form shows only until then.
	ConsentForm:
		data.mayWrite && !data.client.intakeConsent
			? (await import('./ConsentForm.svelte')).default
			: null,
	// The server renders an action's errors at once (the no-JavaScript answer); the browser
	// loads the summary when an answer brings errors (the page asks for it then).
	FormErrors: browser ? null : (await import('./FormErrors.svelte')).default
});
