import { expect, test } from './support/test';

// What only the built app shows (Vite's dev server answers these paths itself).

test('a malformed percent-encoding in an API path answers problem+json 400, not an HTML page', async ({
	request
}) => {
	for (const path of ['/api/v1/clients/%E0%A4%A', '/api/v1/clients/%zz', '/api/v1/me%00']) {
		const res = await request.get(path);
		expect(res.status(), path).toBe(400);
		expect(res.headers()['content-type'], path).toContain('application/problem+json');
		expect((await res.json()).type).toBe('/problems/malformed-path');
	}
});
