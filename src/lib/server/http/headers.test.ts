import { describe, expect, it } from 'vitest';
import { HSTS, isCrossOriginChange, isMalformedPath, securityHeaderValues } from './headers';

// The headers hooks.server.ts adds and the same-origin rule for changes.

describe('response headers', () => {
	it('HSTS over https only', () => {
		expect(securityHeaderValues({ https: true, authenticated: false }).force).toEqual({
			'Strict-Transport-Security': HSTS
		});
		expect(securityHeaderValues({ https: false, authenticated: false }).force).toEqual({});
		expect(HSTS).toMatch(/max-age=31536000/);
	});

	it('no-store on every authenticated answer, forced over what the route said', () => {
		expect(securityHeaderValues({ https: false, authenticated: true }).force).toEqual({
			'Cache-Control': 'no-store'
		});
	});
});

describe('the same-origin rule', () => {
	const here = 'https://seamwell.example';
	const req = (method: string, headers: Record<string, string> = {}) =>
		new Request(`${here}/auth/signout`, { method, headers });

	it('refuses a change from elsewhere or with no Origin, whatever its content type', () => {
		expect(isCrossOriginChange(req('POST', { origin: 'https://evil.example' }), here)).toBe(true);
		expect(isCrossOriginChange(req('POST', { 'content-type': 'application/json' }), here)).toBe(
			true
		);
		expect(isCrossOriginChange(req('DELETE', { origin: 'null' }), here)).toBe(true);
	});

	it('lets through reads and its own changes', () => {
		expect(isCrossOriginChange(req('GET'), here)).toBe(false);
		expect(isCrossOriginChange(req('HEAD'), here)).toBe(false);
		expect(isCrossOriginChange(req('POST', { origin: here }), here)).toBe(false);
	});
});

describe('malformed addresses', () => {
	it('tells a percent-encoding that does not decode', () => {
		expect(isMalformedPath('/api/v1/clients/%E0%A4%A')).toBe(true);
		expect(isMalformedPath('/api/v1/clients/%zz')).toBe(true);
		expect(isMalformedPath('/api/v1/clients/a%00b')).toBe(true);
		expect(isMalformedPath('/api/v1/clients/caf%C3%A9')).toBe(false);
	});
});
