// The headers Seamwell adds to its responses, and the same-origin rule for changes, as plain
// functions of the request (hooks.server.ts applies them; unit tests read them directly).

/** A year, the usual minimum for HSTS; only ever sent over https. */
export const HSTS = 'max-age=31536000; includeSubDomains';

export interface ResponseFacts {
	/** The request was served over https (ORIGIN's scheme behind adapter-node). */
	https: boolean;
	/** The request carried a session, or the answer sets or ends one. */
	authenticated: boolean;
}

/**
 * Headers every response gets (set only where the response has none of its own), and those it
 * must get whatever the route said (`force`): an authenticated answer is never stored by a
 * browser or a proxy (ASVS 14.3.2), whatever it carries — page, JSON or download.
 */
export function securityHeaderValues({ https, authenticated }: ResponseFacts): {
	defaults: Record<string, string>;
	force: Record<string, string>;
} {
	return {
		defaults: {
			'X-Content-Type-Options': 'nosniff',
			'Referrer-Policy': 'strict-origin-when-cross-origin',
			'X-Frame-Options': 'DENY',
			'Cross-Origin-Opener-Policy': 'same-origin',
			'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=()',
			// Non-page responses (JSON, files) get a CSP that forbids everything active.
			'Content-Security-Policy': "default-src 'none'; frame-ancestors 'none'"
		},
		force: {
			...(https ? { 'Strict-Transport-Security': HSTS } : {}),
			...(authenticated ? { 'Cache-Control': 'no-store' } : {})
		}
	};
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Every request that may change something (any method but GET, HEAD and OPTIONS), whatever
 * its content type, must come from Seamwell's own origin. SvelteKit checks only form content
 * types, and Auth.js's own CSRF token is off; this covers JSON and everything else.
 */
export function isCrossOriginChange(request: Request, origin: string): boolean {
	if (SAFE_METHODS.has(request.method)) return false;
	return request.headers.get('origin') !== origin;
}

/**
 * A path whose percent-encoding does not decode (`/api/v1/clients/%E0%A4%A`), or decodes to a
 * NUL. (The decoded value is used on purpose: a bundler drops a call whose result is unused.)
 */
export function isMalformedPath(pathname: string): boolean {
	let decoded: string;
	try {
		decoded = decodeURI(pathname);
	} catch {
		return true;
	}
	return decoded.includes('\u0000');
}
