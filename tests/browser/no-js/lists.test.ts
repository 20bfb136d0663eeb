import { expect, test } from '@playwright/test';
import { signInWithoutScript } from '../support/signin-no-js';

// Every list page renders its first page on the server and pages by plain links, so a browser
// that runs no script sees the same rows. (The demo studio has more clients and referrals than
// the small pages asked for here.)

test('with scripts off, the client list pages by links and the referral list is rendered', async ({
	page
}) => {
	expect(test.info().project.use.javaScriptEnabled).toBe(false);
	await signInWithoutScript(page, 'instructor@studio.example');

	await page.goto('/clients?limit=2');
	const rows = page.locator('tbody tr');
	await expect(rows).toHaveCount(2);
	const first = await rows.first().locator('a').innerText();
	await page.getByRole('link', { name: 'More clients' }).click();
	await expect(page).toHaveURL(/cursor=/);
	await expect(rows).toHaveCount(2);
	expect(await rows.first().locator('a').innerText()).not.toBe(first);
	await page.getByRole('link', { name: 'Back to the start' }).first().click();
	await expect(page).not.toHaveURL(/cursor=/);
	await expect(rows.first().locator('a')).toHaveText(first);

	// The referral list used to be fetched by the page's script alone: now its rows are there.
	await page.goto('/referrals');
	await expect(page.locator('tr[data-referral]').first()).toBeVisible();
});
