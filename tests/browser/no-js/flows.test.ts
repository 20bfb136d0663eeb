import { expect, test } from '@playwright/test';
import { sql } from '../support/signin';
import { signInWithoutScript } from '../support/signin-no-js';

// The main forms with JavaScript switched off (the `no-js` project): every one is a plain
// HTML form that the server answers, so a person whose browser runs no script — or runs it
// late — can still sign in, add and screen a client, refer her and withdraw the referral, and
// give and withdraw consent. Each step checks what the page shows after the post and, where
// cheap, the database. (Axe needs scripts to run, so accessibility is checked by the `browser`
// project on the same pages.) The values are invented.

const INSTRUCTOR = 'instructor@studio.example';
const CLIENT = 'client@client.example';
const OTHER_CLINIC = 'Quillfield Physiotherapy';

const day = (weeksAgo: number) =>
	new Date(Date.now() - weeksAgo * 7 * 86_400_000).toISOString().slice(0, 10);

test.beforeEach(async ({ page }) => {
	// The project switches scripts off; make sure of it, so a pass means what it says: with
	// scripts on, the page would have hydrated (and marked <html data-hydrated>) by now.
	expect(test.info().project.use.javaScriptEnabled).toBe(false);
	await page.goto('/signin');
	await page.waitForLoadState('networkidle');
	await expect(page.locator('html[data-hydrated]')).toHaveCount(0);
});

test('an instructor signs in, adds and screens a client, refers her and withdraws the referral', async ({
	page
}) => {
	test.setTimeout(120_000);
	await signInWithoutScript(page, INSTRUCTOR);

	// Add a client: the server checks the form and names every missing field at once.
	await page.goto('/clients/new');
	await page.getByRole('button', { name: 'Add client' }).click();
	await expect(page.getByRole('alert')).toContainText('need attention');
	const name = `Isla Marren ${Date.now().toString(36)}`;
	await page.getByLabel('Name').fill(name);
	await page.getByLabel('Postpartum').check();
	await page.getByLabel('Birth date').fill(day(10));
	await page.getByLabel('Delivery').selectOption('vaginal');
	await page.getByLabel('Postnatal check done on').fill(day(3));
	await page.getByLabel('How she agreed').selectOption('in_person');
	await page.getByRole('button', { name: 'Add client' }).click();
	await page.waitForURL(/\/clients\/[0-9a-f-]{36}$/);
	await expect(page.getByRole('heading', { level: 1, name })).toBeVisible();
	const clientId = page.url().split('/').at(-1)!;

	// Record a screening past the threshold.
	await page.getByRole('link', { name: 'Record a screening' }).click();
	await page.getByRole('button', { name: 'Record and classify' }).click();
	await expect(page.getByRole('alert')).toContainText('3 fields need attention');
	await page.locator('#above_navel-widthFingers').selectOption('1.5');
	await page.locator('#at_navel-widthFingers').selectOption('3');
	await page.locator('#below_navel-widthFingers').selectOption('1');
	await page.getByRole('button', { name: 'Record and classify' }).click();
	const result = page.getByTestId('screening-result');
	// Sperstad JB et al. 2016 — 3 finger widths at the navel is past ≥ 2: refer to a physio
	await expect(result.getByRole('heading', { name: /Result/ })).toContainText('Refer');
	const [screened] = await sql<{ outcome: string }>(
		`select outcome from screenings where client_id = $1`,
		[clientId]
	);
	expect(screened?.outcome).toBe('refer');

	// Draft a referral for her, then withdraw it: a transition through the referral's form.
	await page.goto('/referrals/new');
	const option = page.locator('#clientId option', { hasText: name });
	await page.locator('#clientId').selectOption((await option.getAttribute('value'))!);
	await page.getByLabel('Clinic').selectOption({ label: 'Fernbank Pelvic Health' });
	await page.getByLabel('Soon').check();
	await page.getByLabel('Reason for the referral').fill('Gap of three finger widths at the navel.');
	await page.getByRole('button', { name: 'Save draft' }).click();
	await page.waitForURL(/\/referrals\/[0-9a-f-]{36}$/);
	const referralId = page.url().split('/').at(-1)!;
	await expect(page.locator('[data-state="draft"]')).toBeVisible();

	const withdraw = page.locator('form', {
		has: page.getByRole('button', { name: 'Withdraw referral' })
	});
	await withdraw.getByLabel(/Reason|Note/).fill('Recorded by mistake, she has a physio already.');
	await withdraw.getByRole('button', { name: 'Withdraw referral' }).click();
	await expect(page.locator('[data-state="withdrawn"]')).toBeVisible();
	const [referral] = await sql<{ state: string }>(`select state from referrals where id = $1`, [
		referralId
	]);
	expect(referral?.state).toBe('withdrawn');
});

test('a client gives consent to share, withdraws it, and marks her home practice done', async ({
	page
}) => {
	test.setTimeout(90_000);
	// Start from no sharing with the second clinic (an earlier run may have left one).
	await sql(
		`update consents set withdrawn_at = now()
		 where withdrawn_at is null
		   and client_id = (select id from clients where email = $1)
		   and clinic_id = (select id from organisations where name = $2)`,
		[CLIENT, OTHER_CLINIC]
	);
	await signInWithoutScript(page, CLIENT);
	await page.goto('/consents');

	const give = page.locator('form', {
		has: page.getByRole('button', { name: 'Give consent', exact: true })
	});
	await give.getByRole('button', { name: 'Give consent', exact: true }).click();
	await expect(page.locator('#clinicId-error')).toBeVisible();
	await give.locator('#clinicId').selectOption({ label: OTHER_CLINIC });
	await give.locator('input[name="scopes"][value="referral"]').check();
	await give.locator('input[name="scopes"][value="screenings"]').check();
	await give.getByRole('button', { name: 'Give consent', exact: true }).click();
	await expect(page.getByText('Your consent is recorded.')).toBeVisible();

	// Withdrawing is one informed step: the box says what stops, the button confirms.
	await page.getByText(`Withdraw consent for ${OTHER_CLINIC}…`).click();
	await page.getByRole('button', { name: `Yes, stop sharing with ${OTHER_CLINIC}` }).click();
	await expect(page.getByText('Your consent is withdrawn.')).toBeVisible();
	const open = await sql<{ n: number }>(
		`select count(*)::int as n from consents
		 where withdrawn_at is null
		   and client_id = (select id from clients where email = $1)
		   and clinic_id = (select id from organisations where name = $2)`,
		[CLIENT, OTHER_CLINIC]
	);
	expect(open[0]?.n).toBe(0);

	// Her home practice: marking it done is a form post too.
	const before = await sql<{ n: number }>(
		`select count(*)::int as n from home_practice_sessions
		 where client_id = (select id from clients where email = $1)`,
		[CLIENT]
	);
	await page.goto('/practice');
	await page.getByRole('button', { name: 'Done, it felt fine' }).click();
	await expect(page.getByRole('status')).toContainText('Marked done');
	const after = await sql<{ n: number }>(
		`select count(*)::int as n from home_practice_sessions
		 where client_id = (select id from clients where email = $1)`,
		[CLIENT]
	);
	expect(after[0]?.n).toBe((before[0]?.n ?? 0) + 1);
});
