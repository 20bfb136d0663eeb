import { expect, test } from './support/test';
import { expectAccessible } from './a11y';
import { signIn } from './support/signin';

test('the landing page says what Seamwell is for, with the caution, and is accessible', async ({
	page
}) => {
	await page.goto('/');
	await expect(page).toHaveTitle(/Seamwell/);
	await expect(page.locator('html')).toHaveAttribute('lang', 'en');
	await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
	// One caution per page, where it is read: not repeated in the footer.
	await expect(page.getByRole('complementary', { name: 'Caution' })).toHaveCount(1);
	await expect(page.getByText('Screening is not a diagnosis.')).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/landing.png', fullPage: true });
});

test('an unknown address shows the designed 404 page', async ({ page }) => {
	const response = await page.goto('/no-such-page');
	expect(response?.status()).toBe(404);
	await expect(page).toHaveTitle('Page not found — Seamwell');
	await expect(page.getByRole('heading', { name: 'We could not find that page' })).toBeVisible();
	await expect(page.getByRole('link', { name: 'Back to the start page' })).toBeVisible();
	await expectAccessible(page);
	await page.screenshot({ path: 'test-results/not-found.png', fullPage: true });
});

test('pages carry the security headers', async ({ request }) => {
	const response = await request.get('/');
	const headers = response.headers();
	expect(headers['content-security-policy']).toContain("script-src 'self'");
	expect(headers['content-security-policy']).toContain("frame-ancestors 'none'");
	expect(headers['content-security-policy']).not.toContain('unsafe-eval');
	expect(headers['x-content-type-options']).toBe('nosniff');
	expect(headers['referrer-policy']).toBe('strict-origin-when-cross-origin');
	expect(headers['x-frame-options']).toBe('DENY');
});

test('a redirect made by Auth.js (immutable headers) carries the same headers as a page', async ({
	request,
	baseURL
}) => {
	// Auth.js answers a bogus confirmation with its own redirect, whose headers cannot be
	// changed in place; the copy must get every header, not a shorter list.
	const response = await request.post(
		'/auth/callback/nodemailer?token=bogus&email=a%40b.example&callbackUrl=%2Fstart',
		{ headers: { origin: baseURL! }, maxRedirects: 0 }
	);
	expect(response.status()).toBeGreaterThanOrEqual(300);
	const headers = response.headers();
	expect(headers['x-content-type-options']).toBe('nosniff');
	expect(headers['x-frame-options']).toBe('DENY');
	expect(headers['cross-origin-opener-policy']).toBe('same-origin');
	expect(headers['permissions-policy']).toContain('camera=()');
});

test('JSON and error responses carry the security headers too', async ({ request }) => {
	for (const path of ['/healthz', '/no-such-page']) {
		const headers = (await request.get(path)).headers();
		expect(headers['x-content-type-options'], path).toBe('nosniff');
		expect(headers['content-security-policy'], path).toBeTruthy();
	}
});

test('every kind of signed-in answer carries the security headers and no-store: page, JSON, problem, PDF, document, CSV', async ({
	page
}) => {
	test.setTimeout(120_000);
	const check = (what: string, headers: Record<string, string>) => {
		expect(headers['x-content-type-options'], what).toBe('nosniff');
		expect(headers['x-frame-options'], what).toBe('DENY');
		expect(headers['content-security-policy'], what).toContain("frame-ancestors 'none'");
		expect(headers['referrer-policy'], what).toBe('strict-origin-when-cross-origin');
		expect(headers['cache-control'], what).toContain('no-store');
	};
	await signIn(page, 'physio@clinic.example');
	const api = page.request;
	check('page', (await api.get('/referrals')).headers());
	const list = await api.get('/api/v1/referrals');
	check('JSON', list.headers());
	const problem = await api.get('/api/v1/referrals?limit=0');
	expect(problem.status()).toBe(422);
	expect(problem.headers()['content-type']).toContain('application/problem+json');
	check('problem', problem.headers());
	// A referral of the clinic's that carries a document: its letter (PDF) and the document.
	let checkedDocument = false;
	for (const referral of ((await list.json()) as { items: Array<{ id: string }> }).items) {
		const documents = (await (
			await api.get(`/api/v1/referrals/${referral.id}/documents`)
		).json()) as { items?: Array<{ id: string }> };
		const first = documents.items?.[0];
		if (!first) continue;
		const letter = await api.get(`/api/v1/referrals/${referral.id}/letter`);
		expect(letter.status()).toBe(200);
		check('letter', letter.headers());
		const file = await api.get(`/api/v1/documents/${first.id}`);
		expect(file.status()).toBe(200);
		check('document', file.headers());
		checkedDocument = true;
		break;
	}
	expect(checkedDocument, 'the demo clinic holds a referral with a document').toBe(true);

	await page.context().clearCookies();
	await signIn(page, 'admin@clinic.example');
	const csv = await page.request.get('/api/v1/audit?format=csv&limit=5');
	expect(csv.status()).toBe(200);
	expect(csv.headers()['content-type']).toContain('text/csv');
	check('CSV', csv.headers());
});
