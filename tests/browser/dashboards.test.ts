import type { Page } from '@playwright/test';
import { expect, test } from './support/test';
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
	{ email: 'client@client.example', path: '/client', heading: 'Home', also: [] },
	{ email: 'client2@client.example', path: '/client', heading: 'Home', also: [] }
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

// The demo scenario's numbers (src/lib/server/demo/). Linden Row Studio's clients by their
// latest screening:
//   Bea Sorensen  2 finger widths at the navel, soft midline → refer
//   Clara Nwosu   3 at the navel, deep, doming → refer
//   Maya Okonjo   pelvic heaviness and leakage → refer (red flags, Goom et al. 2019)
//   Ines Farrow   3 at the navel in pregnancy → monitor, not refer (Mota et al. 2015)
//   Hana Lindqvist, Lena Haddad  at most 1½ finger widths, no finding → not refer
//   Rosa Delgado  never screened → due a screening
//   Lena Haddad   last screened 11 weeks ago, more than 8 → due (our own 8-week rule, no source)
// Refer at ≥ 2 finger widths: Sperstad JB et al. 2016. Harbour Movement's one client,
// Ottilie Brandvold, has 2 at the navel (→ refer) and was screened 2 weeks ago.
// Earlier test files may add clients of their own (never with a demo name), so the client
// counts are checked against the list each links to: the demo clients in it exactly as
// above, and as many rows as the card says.
const LINDEN_ROW_DEMO = [
	'Hana Lindqvist',
	'Bea Sorensen',
	'Clara Nwosu',
	'Ines Farrow',
	'Maya Okonjo',
	'Rosa Delgado',
	'Lena Haddad'
];

/** The number on a dashboard link whose name reads "<n> <label>". */
async function countOn(page: Page, label: string): Promise<number> {
	const link = page.getByRole('link', { name: new RegExp(`^\\d+ ${label}$`) });
	await expect(link).toHaveCount(1);
	return Number((await link.innerText()).match(/^\d+/)![0]);
}

/** Follows a count's link to the clients list; answers the names listed. */
async function clientsBehind(page: Page, label: string): Promise<string[]> {
	await page.getByRole('link', { name: new RegExp(`^\\d+ ${label}$`) }).click();
	await expect(page).toHaveTitle('Clients — Seamwell');
	await expect(page.getByRole('heading', { level: 1, name: 'Clients' })).toBeVisible();
	return page.locator('tbody tr td:first-child a').allInnerTexts();
}

/** Follows a count's link to the referrals list; answers the client names listed. */
async function referralsBehind(page: Page, label: string, count: number): Promise<string[]> {
	await page.getByRole('link', { name: new RegExp(`^\\d+ ${label}$`) }).click();
	await expect(page).toHaveURL(/\/referrals\?state=/);
	await expect(page.getByRole('status')).toContainText(
		count === 1 ? '1 referral shown' : `${count} referrals shown`
	);
	return page.locator('tbody tr td:first-child a').allInnerTexts();
}

test('the instructor dashboard counts clients to refer and to screen, linking to those lists', async ({
	page
}) => {
	await signIn(page, 'instructor@studio.example');
	await expect(page.getByRole('link', { name: 'Add a client' })).toHaveAttribute(
		'href',
		'/clients/new'
	);
	await expect(page.getByRole('link', { name: 'New referral' })).toHaveAttribute(
		'href',
		'/referrals/new'
	);
	await expect(page.getByLabel('Caution')).toBeVisible();

	const refer = await countOn(page, 'clients whose latest screening says refer');
	const toRefer = await clientsBehind(page, 'clients whose latest screening says refer');
	expect(toRefer).toHaveLength(refer);
	expect(toRefer.filter((n) => LINDEN_ROW_DEMO.includes(n)).sort()).toEqual([
		'Bea Sorensen',
		'Clara Nwosu',
		'Maya Okonjo'
	]);
	await expect(page.locator('#needs')).toHaveValue('referral');
	await expectAccessible(page);

	await page.goBack();
	const due = await countOn(page, 'clients due a screening \\(none in 8 weeks\\)');
	const toScreen = await clientsBehind(page, 'clients due a screening \\(none in 8 weeks\\)');
	expect(toScreen).toHaveLength(due);
	expect(toScreen.filter((n) => LINDEN_ROW_DEMO.includes(n)).sort()).toEqual([
		'Lena Haddad',
		'Rosa Delgado'
	]);
	await expect(page.locator('#needs')).toHaveValue('screening');

	// Every card is built: the plans card lists the studio's demo plans and opens one.
	await page.goBack();
	await expect(page.getByText('Not built yet')).toHaveCount(0);
	const demoClass = 'Tuesday postnatal mat class'; // src/lib/server/demo/plans.ts
	const plans = page.locator('section', {
		has: page.getByRole('heading', { name: 'Session plans' })
	});
	await plans.getByRole('link', { name: demoClass }).click();
	await expect(page.getByRole('heading', { level: 1, name: demoClass })).toBeVisible();
});

test('the instructor dashboard counts referrals by state, linking to each list', async ({
	page
}) => {
	await signIn(page, 'instructor@studio.example');
	// Demo referrals (src/lib/server/demo/referrals.ts): Ines Farrow's draft, Bea Sorensen's
	// sent one, Clara Nwosu's withdrawn, Maya Okonjo's accepted 5 days ago; none declined.
	expect(await countOn(page, 'draft to finish and send')).toBe(1);
	expect(await countOn(page, 'sent, awaiting the clinic’s answer')).toBe(1);
	expect(await countOn(page, 'accepted in the last 14 days')).toBe(1);
	expect(await countOn(page, 'declined in the last 14 days')).toBe(0);
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/dashboard-instructor-counts.png', fullPage: true });

	expect(await referralsBehind(page, 'draft to finish and send', 1)).toEqual(['Ines Farrow']);
	await page.goBack();
	expect(await referralsBehind(page, 'sent, awaiting the clinic’s answer', 1)).toEqual([
		'Bea Sorensen'
	]);
	await page.goBack();
	expect(await referralsBehind(page, 'accepted in the last 14 days', 1)).toEqual(['Maya Okonjo']);
	await expectAccessible(page);
});

test('an instructor of another studio counts only her own studio', async ({ page }) => {
	await signIn(page, 'instructor@otherstudio.example');
	expect(await countOn(page, 'client whose latest screening says refer')).toBe(1);
	expect(await clientsBehind(page, 'client whose latest screening says refer')).toEqual([
		'Ottilie Brandvold'
	]);
	await page.goBack();
	expect(await countOn(page, 'clients due a screening \\(none in 8 weeks\\)')).toBe(0);
	expect(await countOn(page, 'drafts to finish and send')).toBe(0);
	expect(await countOn(page, 'sent, awaiting the clinic’s answer')).toBe(0);
});

test('the physiotherapist dashboard counts her clinic’s referrals awaiting an answer', async ({
	page,
	browser
}) => {
	await signIn(page, 'physio@clinic.example');
	await expect(page.getByLabel('Caution')).toBeVisible();
	// Bea Sorensen's referral was sent to Fernbank Pelvic Health; the draft is never counted.
	expect(await countOn(page, 'referral awaiting your clinic’s answer')).toBe(1);
	// Maya Okonjo's referral, accepted by Dr Ilse Marchetti, awaits her assessment.
	expect(await countOn(page, 'accepted referral awaiting assessment')).toBe(1);
	// Every card is built; the review list names clearances due within 14 days or overdue.
	await expect(page.getByText('Not built yet')).toHaveCount(0);
	await expect(page.getByText(/Freya Castellan/)).toBeVisible();
	expect(await referralsBehind(page, 'referral awaiting your clinic’s answer', 1)).toEqual([
		'Bea Sorensen'
	]);
	await expectAccessible(page);
	await page.goBack();
	expect(await referralsBehind(page, 'accepted referral awaiting assessment', 1)).toEqual([
		'Maya Okonjo'
	]);

	const other = await browser.newPage();
	await signIn(other, 'physio@otherclinic.example');
	expect(await countOn(other, 'referrals awaiting your clinic’s answer')).toBe(0);
	await other.close();
});

test('the client dashboard counts her sharing and links to her consents and record', async ({
	page,
	browser
}) => {
	// Bea Sorensen shares with Fernbank Pelvic Health (demo); nobody has asked her for more.
	await signIn(page, 'client2@client.example');
	expect(await countOn(page, 'clinic you share with now')).toBe(1);
	expect(await countOn(page, 'requests to share, waiting for your answer')).toBe(0);
	// Her referral (demo: sent to Fernbank, not yet answered), where she stands at a glance.
	await expect(page.getByTestId('latest-referral')).toHaveText(
		'Your referral to Fernbank Pelvic Health: sent, waiting for the clinic to answer.'
	);
	await expect(page.getByRole('link', { name: 'Open my record' })).toHaveAttribute(
		'href',
		'/my-record'
	);
	await page.getByRole('link', { name: /^\d+ clinic you share with now$/ }).click();
	await expect(page).toHaveURL(/\/consents$/);
	await expect(page.getByText('Fernbank Pelvic Health').first()).toBeVisible();
	await expectAccessible(page);

	// Hana Lindqvist shares with nobody in the demo.
	const hana = await browser.newPage();
	await signIn(hana, 'client@client.example');
	expect(await countOn(hana, 'clinics you share with now')).toBe(0);
	expect(await countOn(hana, 'requests to share, waiting for your answer')).toBe(0);
	await hana.close();
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
