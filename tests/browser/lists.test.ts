import { expect, test } from './support/test';
import { signIn } from './support/signin';

test('a tampered list filter shows the list with a plain note, not field pointers', async ({
	page
}) => {
	await signIn(page, 'instructor@studio.example');
	const response = await page.goto('/clients?sort=bogus&needs=everything');
	expect(response?.status()).toBe(200);
	await expect(page.getByTestId('filter-note')).toContainText('left out');
	await expect(page.getByRole('heading', { level: 1, name: 'Clients' })).toBeVisible();
	await expect(page.getByRole('table')).toBeVisible();
	await expect(page.locator('body')).not.toContainText('/sort');
});

test('a member with two roles is one row with both roles', async ({ page }) => {
	await signIn(page, 'admin@studio.example');
	await page.goto('/admin/members');
	// Maren Okafor (demo) is the studio's instructor and its admin.
	const rows = page.locator('tbody tr', { hasText: 'admin@studio.example' });
	await expect(rows).toHaveCount(1);
	await expect(rows.getByRole('combobox')).toHaveCount(2);
});
