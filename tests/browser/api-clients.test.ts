import type { APIRequestContext } from '@playwright/test';
import { expect, test } from './support/test';
import { signIn } from './support/signin';

// The clients API through the built app: problem details, the consent gate, 404s, isolation.

const day = (weeksAgo: number) =>
	new Date(Date.now() - weeksAgo * 7 * 86_400_000).toISOString().slice(0, 10);
const site = (widthFingers: unknown) => ({
	widthFingers,
	depth: 'shallow',
	tension: 'firm',
	doming: false
});

function api(request: APIRequestContext, origin: string) {
	const headers = { Origin: origin, 'Content-Type': 'application/json' };
	return {
		get: (path: string) => request.get(path),
		post: (path: string, data: unknown) => request.post(path, { headers, data }),
		patch: (path: string, data: unknown) => request.patch(path, { headers, data })
	};
}

test('create, gate, screen and read back through the JSON API', async ({
	page,
	baseURL,
	browser
}) => {
	await signIn(page, 'instructor@studio.example');
	const call = api(page.request, new URL(baseURL!).origin);

	const bad = await call.post('/api/v1/clients', { stage: 'postpartum', birthDate: day(-2) });
	expect(bad.status()).toBe(422);
	expect(bad.headers()['content-type']).toContain('application/problem+json');
	const pointers = (await bad.json()).errors.map((e: { pointer: string }) => e.pointer);
	expect(pointers).toEqual(expect.arrayContaining(['/name', '/birthDate', '/delivery', '/births']));

	const created = await call.post('/api/v1/clients', {
		name: 'Api Person',
		stage: 'postpartum',
		birthDate: day(9),
		delivery: 'caesarean',
		births: 2,
		multiples: false
	});
	expect(created.status()).toBe(201);
	const { id } = await created.json();

	const screening = {
		takenAt: new Date().toISOString(),
		sites: { above_navel: site(1), at_navel: site(2), below_navel: site(1) },
		redFlags: []
	};
	const gated = await call.post(`/api/v1/clients/${id}/screenings`, screening);
	expect(gated.status()).toBe(409);
	expect((await gated.json()).type).toMatch(/intake-consent-required$/);

	const consented = await call.patch(`/api/v1/clients/${id}`, {
		intakeConsent: { at: day(0), method: 'signed_form' }
	});
	expect(consented.status()).toBe(200);
	expect((await consented.json()).intakeConsent.method).toBe('signed_form');

	const invalid = await call.post(`/api/v1/clients/${id}/screenings`, {
		...screening,
		sites: { above_navel: site('two'), at_navel: site(6.5), navel_top: site(1) },
		redFlags: ['sore_toe']
	});
	expect(invalid.status()).toBe(422);
	expect((await invalid.json()).errors.map((e: { pointer: string }) => e.pointer).sort()).toEqual(
		[
			'/redFlags/0',
			'/sites/above_navel/widthFingers',
			'/sites/at_navel/widthFingers',
			'/sites/below_navel',
			'/sites/navel_top'
		].sort()
	);

	const recorded = await call.post(`/api/v1/clients/${id}/screenings`, screening);
	expect(recorded.status()).toBe(201);
	const body = await recorded.json();
	// Sperstad JB et al. 2016 — exactly 2 finger widths counts (≥ 2): refer to a physio
	expect(body.outcome).toBe('refer');
	expect(body.reasons[0]).toMatchObject({ site: 'at_navel', referTo: 'physio' });

	const list = await call.get(`/api/v1/clients/${id}/screenings`);
	const listed = await list.json();
	expect(listed.items).toHaveLength(1);
	expect(listed.trend.at_navel.direction).toBeNull();
	expect(listed.nextCursor).toBeNull();

	expect((await call.get('/api/v1/clients/not-a-uuid')).status()).toBe(404);
	const noOrigin = await page.request.post(`/api/v1/clients/${id}/screenings`, { data: screening });
	expect(noOrigin.status()).toBe(403);

	const other = await browser.newPage();
	await signIn(other, 'instructor@otherstudio.example');
	const otherCall = api(other.request, new URL(baseURL!).origin);
	expect((await otherCall.get(`/api/v1/clients/${id}`)).status()).toBe(404);
	expect((await otherCall.post(`/api/v1/clients/${id}/screenings`, screening)).status()).toBe(404);
	const theirs = await (await otherCall.get('/api/v1/clients?search=Api%20Person')).json();
	expect(theirs.items).toEqual([]);
	await other.close();
});
