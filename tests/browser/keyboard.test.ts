import { expect, test } from './support/test';
import type { Locator, Page } from '@playwright/test';
import { forgetSignInRequests, countMail, linkIn, waitForNewMail } from './support/signin';

// Keyboard only: signing in and recording a screening without the mouse. Each control is
// reached with Tab (in the page's own order, within a bounded number of presses), shows a
// visible focus indicator (WCAG 2.4.7), and is operated with the keyboard.

/** Presses Tab until `target` has focus; fails if it is not reached within `limit` presses. */
async function tabTo(page: Page, target: Locator, limit = 80): Promise<void> {
	for (let i = 0; i < limit; i++) {
		await page.keyboard.press('Tab');
		if (await target.evaluate((el) => el === document.activeElement)) {
			const visible = await target.evaluate((el) => {
				const style = getComputedStyle(el);
				const outline = style.outlineStyle !== 'none' && parseFloat(style.outlineWidth) > 0;
				return outline || (style.boxShadow !== 'none' && style.boxShadow !== '');
			});
			expect(visible, 'a visible focus indicator').toBe(true);
			return;
		}
	}
	throw new Error(`not reached with Tab: ${target}`);
}

test('keyboard only: sign in, then record a screening', async ({ page }) => {
	test.setTimeout(120_000);
	const email = 'instructor@studio.example';
	await forgetSignInRequests(email);
	const seen = await countMail(email, 'Your Seamwell sign-in link');
	await page.goto('/signin');
	const address = page.getByLabel('E-mail address');
	await tabTo(page, address);
	await page.keyboard.type(email);
	await page.keyboard.press('Enter');
	await expect(page).toHaveURL(/\/signin\/sent$/);
	const mail = await waitForNewMail(email, 'Your Seamwell sign-in link', seen);
	await page.goto(linkIn(mail, '/signin/confirm'));
	await tabTo(page, page.getByRole('button', { name: 'Sign in to Seamwell' }));
	await page.keyboard.press('Enter');
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));

	// The client list, then her record, then the screening form: links followed with Enter.
	await page.goto('/clients');
	const client = page.getByRole('link', { name: /Maya Okonjo/ }).first();
	await tabTo(page, client);
	await page.keyboard.press('Enter');
	await expect(page.getByRole('heading', { level: 1, name: /Maya Okonjo/ })).toBeVisible();
	await tabTo(page, page.getByRole('link', { name: 'Record a screening' }));
	await page.keyboard.press('Enter');
	await expect(page).toHaveTitle(/Record a screening/);

	for (const site of ['above_navel', 'at_navel', 'below_navel']) {
		const width = page.locator(`#${site}-widthFingers`);
		await tabTo(page, width);
		// A closed select moves to the next option with the arrow key: "Choose", then 0, 0.5 …
		await page.keyboard.press('ArrowDown');
		await page.keyboard.press('ArrowDown');
		await expect(width).not.toHaveValue('');
	}
	await tabTo(page, page.getByRole('button', { name: 'Record and classify' }));
	await page.keyboard.press('Enter');
	await expect(
		page.getByTestId('screening-result').getByRole('heading', { name: /Result/ })
	).toBeVisible();
});
