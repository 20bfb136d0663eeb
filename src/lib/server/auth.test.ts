import { describe, expect, it } from 'vitest';
import { sessionCookieName } from './auth';

// The session cookie's name decides what the browser enforces on it.

describe('the session cookie', () => {
	it('takes the __Host- prefix over https (Secure, path /, no Domain: ASVS 3.3.3)', () => {
		expect(sessionCookieName(new URL('https://seamwell.example/'))).toBe(
			'__Host-authjs.session-token'
		);
	});

	it('has no prefix over plain http (a prefixed cookie needs Secure)', () => {
		expect(sessionCookieName(new URL('http://127.0.0.1:3000/'))).toBe('authjs.session-token');
	});
});
