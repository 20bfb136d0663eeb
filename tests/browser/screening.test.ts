import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

// An instructor adds a client, records a screening over the threshold, sees "refer" with its
// reasons, and finds the chart, table and trend updated on the client's page.

const day = (weeksAgo: number) =>
	new Date(Date.now() - weeksAgo * 7 * 86_400_000).toISOString().slice(0, 10);

test('an instructor adds a client, screens her past the threshold and sees refer, reasons and chart', async ({
	page
}) => {
	const name = `Wren Calloway ${Date.now().toString(36)}`;
	await signIn(page, 'instructor@studio.example');

	await page.goto('/clients/new');
	await expect(page).toHaveTitle('Add a client — Seamwell');
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('Postpartum').check();
	await page.getByLabel('Birth date').fill(day(10));
	await page.getByLabel('Delivery').selectOption('vaginal');
	await page.getByLabel('Postnatal check done on').fill(day(3));
	await page.getByLabel('How she agreed').selectOption('in_person');
	await expectAccessible(page);
	await page.getByRole('button', { name: 'Add client' }).click();
	await page.waitForURL(/\/clients\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
	await expect(page.getByText('No screenings yet.')).toBeVisible();

	await page.getByRole('link', { name: 'Record a screening' }).click();
	await expect(page).toHaveTitle(`Record a screening — ${name} — Seamwell`);
	// Bad input first: a missing width is named beside its field, nothing is recorded.
	await page.getByRole('button', { name: 'Record and classify' }).click();
	await expect(page.getByRole('alert')).toContainText('3 fields need attention');
	await expect(page.locator('#at_navel-widthFingers-error')).toHaveText(
		'Choose the gap width at the navel'
	);

	await page.locator('#above_navel-widthFingers').selectOption('1.5');
	await page.locator('#at_navel-widthFingers').selectOption('3');
	await page.locator('#below_navel-widthFingers').selectOption('1');
	await page.getByRole('button', { name: 'Record and classify' }).click();

	const result = page.getByTestId('screening-result');
	await expect(result.getByRole('heading', { name: /Result/ })).toContainText('Refer');
	// Sperstad JB et al. 2016 — 3 finger widths at the navel is past ≥ 2: refer to a physio
	await expect(result).toContainText('At the navel: a gap of 3 finger widths');
	await expect(result).toContainText('Refer to a pelvic-health physiotherapist');
	await expect(result).toContainText('Source: Sperstad JB et al.');
	// Finger widths shown with an mm estimate, labelled as such with the factor used.
	await expect(result.getByTestId('screening-widths')).toContainText(
		/3 finger widths \(≈ \d+ mm, estimate at [\d.]+ mm per finger\)/
	);
	await expect(result.getByRole('complementary', { name: 'Caution' })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/screening-result.png', fullPage: true });

	await result.getByRole('link', { name: 'See her chart and history' }).click();
	await expect(page.getByRole('heading', { name: 'Each site over time' })).toBeVisible();
	await expect(page.locator('#chart-at_navel-title')).toHaveText('At the navel');
	// One point, marked by its outcome's shape, in the at-the-navel chart.
	await expect(page.locator('figure:has(#chart-at_navel-title) svg g > title')).toHaveCount(1);
	await expect(page.getByRole('table', { name: /Every screening/ })).toContainText('3');
	// Each cell gives the estimate; how it is made is said once, under the table.
	const table = page.getByRole('table', { name: /Every screening/ });
	await expect(table).toContainText(/≈ \d+ mm/);
	await expect(table).not.toContainText('estimate at');
	await expect(page.getByTestId('mm-estimate-note')).toContainText('estimate');
	await expect(page.getByTestId('trend-at_navel')).toContainText('Needs two screenings');
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/client-page.png', fullPage: true });

	// Where the factor is set: read only here, so other tests' estimates stay as they are.
	await page
		.getByTestId('mm-estimate-note')
		.getByRole('link', { name: 'your account page' })
		.click();
	await expect(page.getByLabel('Millimetres per finger width')).toBeVisible();
	await expectAccessible(page);

	await page.goto(`/clients?search=${encodeURIComponent(name)}&needs=referral`);
	await expect(page.getByRole('link', { name })).toBeVisible();
	await expect(page).toHaveTitle('Clients — Seamwell');
	await expectAccessible(page);
});

test('the screening form fits a phone, and a demo client shows a chart with history', async ({
	page
}) => {
	await page.setViewportSize({ width: 390, height: 844 });
	await signIn(page, 'instructor@studio.example');
	await page.goto('/clients?search=Hana');
	await page.getByRole('link', { name: 'Hana Lindqvist' }).click();
	await expect(page.getByTestId('trend-at_navel')).toContainText('Narrowing');
	await page.screenshot({ path: 'test-results/client-page-phone.png', fullPage: true });
	await page.getByRole('link', { name: 'Record a screening' }).click();
	await expect(page.getByRole('button', { name: 'Record and classify' })).toBeVisible();
	const overflow = await page.evaluate(
		() => document.documentElement.scrollWidth > document.documentElement.clientWidth
	);
	expect(overflow, 'no sideways scrolling on a phone').toBe(false);
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/screening-form-phone.png', fullPage: true });
});

test('the client sees her own screenings in plain words', async ({ page }) => {
	await signIn(page, 'client@client.example');
	await page.goto('/my-record');
	await expect(page).toHaveTitle('My record — Seamwell');
	await expect(page.getByRole('heading', { name: /Your latest screening/ })).toBeVisible();
	await expect(page.getByText('narrower by', { exact: false }).first()).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/my-record.png', fullPage: true });
});
