// Playwright's `test` and `expect`, with one change: `page.goto` of an HTML page returns only
// once Svelte has hydrated it (the root layout marks <html data-hydrated>), and after the
// accessibility check (WCAG 2.2 A/AA) has passed on it — so every page a test opens is
// checked. Typing into a server-rendered form before hydration races the framework on a busy
// machine; a person is slower than that, a test is not.
import { test as base, expect, type Page } from '@playwright/test';
import { expectAccessible } from '../a11y';

/**
 * Gives a page the fixture's `goto` (waits for hydration, then checks accessibility). The
 * fixture's page has it; apply it to a page a spec opens itself (`browser.newContext()`).
 */
export function waitingForHydration(page: Page): Page {
	const goto = page.goto.bind(page);
	page.goto = async (url, options) => {
		const response = await goto(url, options);
		const type = response?.headers()['content-type'] ?? '';
		if (type.startsWith('text/html')) {
			await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
			await expectAccessible(page);
		}
		return response;
	};
	return page;
}

export const test = base.extend({
	page: async ({ page }, use) => {
		await use(waitingForHydration(page));
	}
});

export { expect };
