import { expect, test } from '@playwright/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// Every demo account signs in through the real mail link and lands on its own dashboard.
const accounts = [
	{
		email: 'admin@studio.example',
		path: '/instructor',
		heading: 'Instructor dashboard',
		also: ['Admin', 'Members']
	},
	{
		email: 'instructor@studio.example',
		path: '/instructor',
		heading: 'Instructor dashboard',
		also: []
	},
	{
		email: 'instructor2@studio.example',
		path: '/instructor',
		heading: 'Instructor dashboard',
		also: []
	},
	{
		email: 'instructor@otherstudio.example',
		path: '/instructor',
		heading: 'Instructor dashboard',
		also: []
	},
	{ email: 'admin@clinic.example', path: '/admin', heading: 'Admin dashboard', also: ['Members'] },
	{
		email: 'physio@clinic.example',
		path: '/physio',
		heading: 'Physiotherapist dashboard',
		also: []
	},
	{
		email: 'physio@otherclinic.example',
		path: '/physio',
		heading: 'Physiotherapist dashboard',
		also: []
	},
	{ email: 'client@client.example', path: '/client', heading: 'My record', also: [] },
	{ email: 'client2@client.example', path: '/client', heading: 'My record', also: [] }
];

for (const account of accounts) {
	test(`${account.email} signs in and sees the ${account.heading}`, async ({ page }) => {
		await signIn(page, account.email);
		await expect(page).toHaveURL(new RegExp(`${account.path}$`));
		await expect(page.getByRole('heading', { level: 1, name: account.heading })).toBeVisible();
		await expect(page).toHaveTitle(`${account.heading} — Seamwell`);
		const nav = page.getByRole('navigation', { name: 'Main' });
		for (const label of account.also) {
			await expect(nav.getByRole('link', { name: label, exact: true })).toBeVisible();
		}
		await expectAccessible(page);
		await page.screenshot({
			path: `test-results/dashboard-${account.email.replace(/[@.]/g, '-')}.png`,
			fullPage: true
		});
	});
}

test('the admin dashboard counts members and links to the member list', async ({ page }) => {
	await signIn(page, 'admin@clinic.example');
	await expect(page.getByText(/2\s+active\s+members/)).toBeVisible();
	await page.getByRole('link', { name: 'Manage members and invitations' }).click();
	await expect(page).toHaveTitle('Members — Seamwell');
	await expect(page.getByRole('cell', { name: /physio@clinic\.example/ })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/admin-members.png', fullPage: true });
});

test("another role's page is simply not there", async ({ page }) => {
	await signIn(page, 'instructor@studio.example');
	for (const path of ['/admin', '/admin/members', '/physio', '/client']) {
		const response = await page.goto(path);
		expect(response?.status(), path).toBe(404);
		await expect(page.getByRole('heading', { name: 'We could not find that page' })).toBeVisible();
	}
	await expectAccessible(page);
});

test('the account page lists where she works', async ({ page }) => {
	await signIn(page, 'admin@studio.example');
	await page.getByRole('link', { name: 'Maren Okafor' }).click();
	await expect(page).toHaveTitle('Your account — Seamwell');
	await expect(page.getByText('Studio · admin')).toBeVisible();
	await expect(page.getByText('Studio · instructor')).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/account.png', fullPage: true });
});
