// No page scrolls sideways on a phone or a tablet: every demo role signs in, walks every page
// it can reach by following links from its start page (records included), and each page is
// measured at 320, 390 and 768 px. A page wider than the window hides its right-hand side
// on the studio floor. Each page also passes axe (WCAG 2.2 A/AA, target size included) at a
// phone's and a desktop's width.
import { expect, test, type Page } from '@playwright/test';
import { accessibilityViolations } from './a11y';
import { signIn } from './support/signin';

const WIDTHS = [320, 390, 768];

const ROLES = [
	{ role: 'instructor', email: 'instructor@studio.example' },
	{ role: 'studio admin', email: 'admin@studio.example' },
	{ role: 'physiotherapist', email: 'physio@clinic.example' },
	{ role: 'clinic admin', email: 'admin@clinic.example' },
	{ role: 'client', email: 'client@client.example' }
];

/** Pages, not files or actions: what a person opens by following a link. */
function isPage(url: URL, origin: string): boolean {
	if (url.origin !== origin) return false;
	return !/^\/(api|auth|problems|healthz|signin)(\/|$)/.test(url.pathname);
}

/** Every page reachable from the start page within two clicks, one URL per route shape. */
async function reachablePages(page: Page, origin: string): Promise<string[]> {
	const seen = new Set<string>();
	const shapes = new Set<string>();
	let frontier = [new URL(page.url()).pathname];
	for (let depth = 0; depth < 3 && frontier.length > 0; depth++) {
		const next: string[] = [];
		for (const path of frontier) {
			// One record of each kind is enough: /clients/<id> stands for all of them.
			const shape = path.replace(/[0-9a-f-]{36}/g, ':id');
			if (seen.has(path) || shapes.has(shape)) continue;
			seen.add(path);
			shapes.add(shape);
			await page.goto(path);
			const hrefs = await page
				.locator('a[href]:not([download])')
				.evaluateAll((links) => links.map((a) => (a as HTMLAnchorElement).href));
			for (const href of hrefs) {
				const url = new URL(href);
				if (isPage(url, origin)) next.push(url.pathname);
			}
		}
		frontier = next;
	}
	return [...seen];
}

async function overflowAt(page: Page, path: string, width: number): Promise<number> {
	await page.setViewportSize({ width, height: 800 });
	await page.goto(path);
	await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
	return page.evaluate(
		() => document.documentElement.scrollWidth - document.documentElement.clientWidth
	);
}

for (const { role, email } of ROLES) {
	test(`every page passes axe at 390 and 1280 px and none scrolls sideways at 320, 390 or 768 px: ${role}`, async ({
		page,
		baseURL
	}) => {
		test.setTimeout(600_000);
		await signIn(page, email);
		const pages = await reachablePages(page, new URL(baseURL!).origin);
		expect(pages.length).toBeGreaterThan(2);
		const tooWide: string[] = [];
		const violations: string[] = [];
		for (const path of pages) {
			for (const width of WIDTHS) {
				const overflow = await overflowAt(page, path, width);
				if (overflow > 0) tooWide.push(`${path} at ${width} px: ${overflow} px too wide`);
			}
			const name = `${role}-${path}`.replace(/[^a-z0-9]+/gi, '-').slice(0, 80);
			for (const width of [390, 1280]) {
				await page.setViewportSize({ width, height: 800 });
				for (const line of await accessibilityViolations(page)) {
					violations.push(`${path} at ${width} px: ${line}`);
				}
			}
			await page.setViewportSize({ width: 390, height: 800 });
			await page.screenshot({ path: `test-results/phone/${name}.png`, fullPage: true });
		}
		expect(tooWide).toEqual([]);
		expect(violations, 'accessibility violations').toEqual([]);
	});
}

test('the phone menu opens, lists the areas and closes after choosing', async ({ page }) => {
	await signIn(page, 'instructor@studio.example');
	await page.setViewportSize({ width: 390, height: 800 });
	const menu = page.getByText('Menu', { exact: true });
	await menu.click();
	const nav = page.getByRole('navigation', { name: 'Menu' });
	await expect(nav.getByRole('link', { name: 'Clients' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
	await nav.getByRole('link', { name: 'Clients' }).click();
	await page.waitForURL(/\/clients$/);
	await expect(nav).toBeHidden();
});

test('the public pages fit a phone too', async ({ page }) => {
	for (const path of ['/', '/signin']) {
		for (const width of WIDTHS) {
			expect(await overflowAt(page, path, width), `${path} at ${width} px`).toBe(0);
		}
	}
});
