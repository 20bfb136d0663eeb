import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { countMail, forgetSignInRequests, requestSignInLink, signIn, sql } from './support/signin';

const unknown = () => `nobody-${Date.now()}@nowhere.example`;

test('the sign-in page is accessible and says how signing in works', async ({ page }) => {
	await page.goto('/signin');
	await expect(page).toHaveTitle('Sign in — Seamwell');
	await expect(page.getByRole('heading', { level: 1, name: 'Sign in' })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/signin.png', fullPage: true });
});

test('an unknown address gets the same page and no mail', async ({ page }) => {
	const address = unknown();
	await forgetSignInRequests(address);
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(address);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page).toHaveURL(/\/signin\/sent$/);
	await expect(page.getByRole('heading', { name: 'Check your inbox' })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/signin-sent.png', fullPage: true });
	// A known address's mail arrives in well under a second (see signIn); give it two.
	await page.waitForTimeout(2000);
	expect(await countMail(address)).toBe(0);
});

test('a malformed or empty address gets a plain message, not a 500', async ({ page }) => {
	await page.goto('/signin');
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByText('Enter your e-mail address.')).toBeVisible();
	await page.getByLabel('E-mail address').fill('not an address');
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page.getByText('Enter an e-mail address like name@example.com.')).toBeVisible();
	await expectAccessible(page);
});

test('a form post without a same-origin Origin header is refused with 403', async ({ request }) => {
	const response = await request.post('/signin', {
		form: { email: 'admin@studio.example' },
		headers: { origin: 'https://elsewhere.example', accept: 'text/html' },
		maxRedirects: 0
	});
	expect(response.status()).toBe(403);
});

test('Auth.js routes other than the confirmation and sign-out are closed', async ({
	request,
	baseURL
}) => {
	// A direct request for a link would skip the rate limits, the equal timing and the log.
	const email = 'instructor@studio.example';
	const before = await countMail(email);
	const direct = await request.post('/auth/signin/nodemailer', {
		headers: { origin: baseURL!, 'content-type': 'application/x-www-form-urlencoded' },
		data: `email=${encodeURIComponent(email)}&callbackUrl=%2Fstart`,
		maxRedirects: 0
	});
	expect(direct.status()).toBe(404);
	for (const path of ['/auth/session', '/auth/csrf', '/auth/providers', '/auth/signin']) {
		expect((await request.get(path, { maxRedirects: 0 })).status(), path).toBe(404);
	}
	await new Promise((r) => setTimeout(r, 1500));
	expect(await countMail(email)).toBe(before);
});

test('a mail scanner fetching the link uses nothing up', async ({ page, request }) => {
	const link = await requestSignInLink(page, 'instructor2@studio.example');
	// The scanner follows the link and also the raw Auth.js callback form of it.
	const callback = link.replace('/signin/confirm', '/auth/callback/nodemailer');
	const scanned = await request.get(callback, { maxRedirects: 0 });
	expect(scanned.status()).toBe(303);
	expect(scanned.headers()['location']).toContain('/signin/confirm?');
	await request.get(link);
	await page.goto(link);
	await expect(page).toHaveTitle('Confirm sign-in — Seamwell');
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/signin-confirm.png', fullPage: true });
	await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await expect(page).toHaveURL(/\/instructor$/);
});

test('a link used twice is refused the second time and offers a new one', async ({
	page,
	browser
}) => {
	const link = await requestSignInLink(page, 'instructor@studio.example');
	await page.goto(link);
	await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await expect(page).toHaveURL(/\/instructor$/);

	const other = await browser.newContext();
	const second = await other.newPage();
	await second.goto(link);
	await expect(
		second.getByRole('heading', { name: 'This sign-in link was already used' })
	).toBeVisible();
	await expect(second.getByRole('link', { name: 'Send me a new link' })).toBeVisible();
	await expectAccessible(second);
	await second.screenshot({ path: 'test-results/signin-used.png', fullPage: true });
	await other.close();
});

test('a link older than 10 minutes is refused as expired', async ({ page }) => {
	const link = await requestSignInLink(page, 'physio@clinic.example');
	// Move the clock: the token's stored expiry is now in the past.
	await sql(
		`update verification_tokens set expires = now() - interval '1 second' where identifier = $1`,
		['physio@clinic.example']
	);
	await page.goto(link);
	await expect(page.getByRole('heading', { name: 'This sign-in link has expired' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Sign in to Seamwell' })).toHaveCount(0);
	await expectAccessible(page);
});

test('an expired link pressed on an open confirmation page is refused too', async ({ page }) => {
	const link = await requestSignInLink(page, 'physio@otherclinic.example');
	await page.goto(link);
	await sql(
		`update verification_tokens set expires = now() - interval '1 second' where identifier = $1`,
		['physio@otherclinic.example']
	);
	await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await expect(page).toHaveURL(/\/signin\/error\?reason=expired$/);
	await expect(page.getByRole('heading', { name: 'This sign-in link has expired' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Sign out' })).toHaveCount(0);
});

test('an altered link is refused', async ({ page }) => {
	const link = await requestSignInLink(page, 'client2@client.example');
	const url = new URL(link);
	url.searchParams.set(
		'token',
		url.searchParams.get('token')!.replace(/.$/, (c) => (c === 'a' ? 'b' : 'a'))
	);
	await page.goto(url.toString());
	await expect(page.getByRole('heading', { name: 'This sign-in link is not valid' })).toBeVisible();
});

test('sign-out is on every page and ends the session on the server', async ({ page, context }) => {
	await signIn(page, 'client@client.example');
	const cookie = (await context.cookies()).find((c) => c.name.endsWith('authjs.session-token'));
	expect(cookie?.httpOnly).toBe(true);
	expect(cookie?.sameSite).toBe('Lax');
	for (const path of ['/', '/account', '/problems/not-found']) {
		await page.goto(path);
		await expect(page.getByRole('button', { name: 'Sign out' })).toBeVisible();
	}
	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/signin\?signedOut=1$/);
	await expect(page.getByRole('status')).toContainText('You are signed out');
	const rows = await sql('select 1 from sessions where session_token = $1', [cookie!.value]);
	expect(rows).toHaveLength(0);
	// The old cookie, sent again, opens nothing.
	const replay = await page.request.get('/api/v1/me', {
		headers: { cookie: `${cookie!.name}=${cookie!.value}` }
	});
	expect(replay.status()).toBe(401);
	await page.goto('/client');
	await expect(page).toHaveURL(/\/signin\?callbackUrl=%2Fclient$/);
});

test('a tampered session cookie leads to the sign-in page, not an error', async ({
	page,
	context
}) => {
	await context.addCookies([
		{
			name: 'authjs.session-token',
			value: 'forged-value',
			url: process.env.ORIGIN ?? 'http://127.0.0.1:3010'
		}
	]);
	const response = await page.goto('/instructor');
	expect(response?.status()).toBe(200);
	await expect(page).toHaveURL(/\/signin\?callbackUrl=/);
});
