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

test('every list page shows more rows in place, from its API, keeping the filters', async ({
	page
}) => {
	await signIn(page, 'instructor@studio.example');
	await page.goto('/clients?limit=2&sort=name');
	const rows = page.locator('tbody tr');
	await expect(rows).toHaveCount(2);
	const before = page.url();
	await page.getByRole('link', { name: 'More clients' }).click();
	await expect(rows).toHaveCount(4);
	expect(page.url()).toBe(before);
	const names = await rows.locator('a').allInnerTexts();
	expect(names).toEqual([...names].sort((a, b) => a.localeCompare(b)));

	await page.goto('/referrals?limit=1');
	const referrals = page.locator('tr[data-referral]');
	await expect(referrals).toHaveCount(1);
	await page.getByRole('link', { name: 'More referrals' }).click();
	await expect(referrals).toHaveCount(2);
});

test('a tampered referral filter shows the list with a plain note', async ({ page }) => {
	await signIn(page, 'instructor@studio.example');
	const response = await page.goto('/referrals?sort=bogus');
	expect(response?.status()).toBe(200);
	await expect(page.getByTestId('filter-note')).toContainText('left out');
	await expect(page.locator('tr[data-referral]').first()).toBeVisible();
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

test('an access-log filter that cannot be read is named beside its field, not as a pointer', async ({
	page
}) => {
	await signIn(page, 'admin@studio.example');
	const response = await page.goto('/admin/access-log?from=2026-12-01&to=2026-11-01');
	expect(response?.status()).toBe(200);
	await expect(page.getByLabel('From (UTC)')).toHaveAttribute('aria-invalid', 'true');
	await expect(page.locator('#from-error')).toContainText('on or before the end');
	await expect(page.getByRole('alert')).toContainText('Fix the dates above');
	await expect(page.locator('body')).not.toContainText('/from');
	await expect(page.locator('[data-event]')).toHaveCount(0);
});
