import { Auth, raw, skipCSRFCheck } from '@auth/core';
import type { Adapter, AdapterSession, AdapterUser } from '@auth/core/adapters';
import { DrizzleAdapter } from '@auth/drizzle-adapter';
import { SvelteKitAuth, type SvelteKitAuthConfig } from '@auth/sveltekit';
import Nodemailer from '@auth/sveltekit/providers/nodemailer';
import type { Handle, RequestEvent } from '@sveltejs/kit';
import { config } from './config';
import { db, type Executor } from './db';
import { accounts, sessions, users, verificationTokens } from './db/schema';
import { queueMail } from './mail/outbox';
import { consumeSignInAllowance } from './people/rate-limit';
import {
	SESSION_IDLE_SECONDS,
	SESSION_TOUCH_SECONDS,
	SIGNIN_LINK_SECONDS,
	recordSignInEvent,
	replaceSignInToken,
	supersedeUnsentSignInMail,
	sessionEnd,
	signInEligibility
} from './people/sessions';

// Every Auth.js import lives here (and nowhere else but hooks.server.ts, which uses this
// module). Auth.js does the e-mail link and the session row; Seamwell decides who may
// receive a link, delivers it through the outbox, and limits how long a session lasts.

export const AUTH_BASE = '/auth';
export const CALLBACK_PATH = `${AUTH_BASE}/callback/nodemailer`;
export const SIGNOUT_PATH = `${AUTH_BASE}/signout`;

/**
 * Auth.js's session cookie name. Over https it carries the `__Host-` prefix (ASVS 3.3.3): the
 * browser then accepts it only if Secure, for path `/`, and without a Domain — so no other
 * host, a sibling subdomain included, can set or shadow it.
 */
export function sessionCookieName(url: URL): string {
	return url.protocol === 'https:' ? '__Host-authjs.session-token' : 'authjs.session-token';
}

/** Where both known and unknown addresses are sent after asking for a link. */
const VERIFY_REQUEST_PATH = `${AUTH_BASE}/verify-request?provider=nodemailer&type=email`;

/**
 * The mail links to Seamwell's own confirmation page, carrying the same query as Auth.js's link.
 * A new link ends the person's earlier unused ones: the adapter below deletes their tokens, and
 * a link mail still waiting in the outbox is not sent (`superseded`).
 */
async function queueSignInLink(params: { identifier: string; url: string }): Promise<void> {
	const authLink = new URL(params.url);
	const link = `${authLink.origin}/signin/confirm?${authLink.searchParams}`;
	await db().transaction(async (tx) => {
		await supersedeUnsentSignInMail(tx, params.identifier);
		await queueSignInMail(tx, params.identifier, link);
	});
}

async function queueSignInMail(tx: Executor, to: string, link: string): Promise<void> {
	await queueMail(tx, {
		to,
		kind: 'signin.link',
		subject: 'Your Seamwell sign-in link',
		text: [
			'Open this link to sign in to Seamwell. It works once, within 10 minutes:',
			'',
			link,
			'',
			'If you did not ask to sign in, ignore this mail: nobody can sign in without this link.'
		].join('\n')
	});
}

/**
 * The Drizzle adapter with Seamwell's limits: a session older than its absolute lifetime, or
 * of a deactivated person, is deleted and refused; people are never created by signing in.
 */
function seamwellAdapter(): Adapter {
	const base = DrizzleAdapter(db(), {
		usersTable: users,
		accountsTable: accounts,
		sessionsTable: sessions,
		verificationTokensTable: verificationTokens
	});
	return {
		...base,
		// Only the newest sign-in link works: storing a token deletes her earlier ones.
		async createVerificationToken(token) {
			await replaceSignInToken(token);
			return token;
		},
		async createUser(): Promise<AdapterUser> {
			throw new Error('Seamwell adds people through invitations, never by signing in.');
		},
		async getSessionAndUser(sessionToken) {
			const found = await base.getSessionAndUser!(sessionToken);
			if (!found) return null;
			const session = found.session as AdapterSession & { createdAt?: Date };
			const user = found.user as AdapterUser & { active?: boolean };
			const ended = sessionEnd({
				expires: session.expires,
				createdAt: session.createdAt ?? new Date(0),
				active: user.active ?? false
			});
			if (ended && ended !== 'idle') {
				await base.deleteSession!(sessionToken);
				return null;
			}
			return found;
		}
	};
}

let cached: SvelteKitAuthConfig | undefined;

function authConfig(): SvelteKitAuthConfig {
	if (cached) return cached;
	const c = config();
	cached = {
		adapter: seamwellAdapter(),
		secret: c.AUTH_SECRET,
		// Behind adapter-node AUTH_TRUST_HOST is ignored; ORIGIN pins the host instead.
		trustHost: true,
		basePath: AUTH_BASE,
		skipCSRFCheck,
		useSecureCookies: new URL(c.ORIGIN).protocol === 'https:',
		// Over https the session cookie takes the __Host- prefix (Auth.js's default is __Secure-).
		cookies:
			new URL(c.ORIGIN).protocol === 'https:'
				? {
						sessionToken: {
							name: sessionCookieName(new URL(c.ORIGIN)),
							options: { httpOnly: true, sameSite: 'lax', path: '/', secure: true }
						}
					}
				: undefined,
		session: {
			strategy: 'database',
			maxAge: SESSION_IDLE_SECONDS,
			updateAge: SESSION_TOUCH_SECONDS
		},
		pages: {
			signIn: '/signin',
			signOut: '/signin',
			verifyRequest: '/signin/sent',
			error: '/signin/error'
		},
		providers: [
			Nodemailer({
				// Never used: the link mail goes through the outbox and its worker.
				server: { host: c.SMTP_HOST, port: c.SMTP_PORT },
				from: c.MAIL_FROM,
				maxAge: SIGNIN_LINK_SECONDS,
				sendVerificationRequest: queueSignInLink
			})
		],
		callbacks: {
			// Runs before any token or mail. An unknown or deactivated address gets the same
			// redirect as a known one, with no token and no mail (no account discovery).
			async signIn({ user, email }) {
				const { eligible } = await signInEligibility(user.email ?? '');
				if (eligible) return true;
				return email?.verificationRequest ? VERIFY_REQUEST_PATH : false;
			}
		}
	};
	return cached;
}

/** Auth.js's own routes under /auth (callback, sign-out, session). */
export const authHandle: Handle = SvelteKitAuth(async () => authConfig()).handle;

/** Both answers take at least this long, so timing does not tell a known address from another. */
const SIGNIN_REQUEST_FLOOR_MS = 400;

export type SignInRequestOutcome = 'sent' | 'limited';

/**
 * Asks Auth.js for a sign-in link (only an eligible address gets one, queued in the outbox),
 * after the rate limits; records the request in the access log. Same answer, same time,
 * for every address.
 */
export async function requestSignInLink(
	event: RequestEvent,
	email: string,
	callbackUrl: string
): Promise<SignInRequestOutcome> {
	const started = Date.now();
	try {
		return await askForLink(event, email, callbackUrl);
	} finally {
		const wait = SIGNIN_REQUEST_FLOOR_MS - (Date.now() - started);
		if (wait > 0) await new Promise((r) => setTimeout(r, wait));
	}
}

async function askForLink(
	event: RequestEvent,
	email: string,
	callbackUrl: string
): Promise<SignInRequestOutcome> {
	const access = event.locals.access;
	const allowance = await consumeSignInAllowance(email, access.address);
	if (!allowance.allowed) {
		await recordSignInEvent(access, {
			action: 'signin.refused',
			outcome: 'refused',
			email,
			target: { type: 'rate_limit', id: allowance.bucket }
		});
		return 'limited';
	}
	const who = await signInEligibility(email);
	const request = new Request(`${event.url.origin}${AUTH_BASE}/signin/nodemailer`, {
		method: 'POST',
		headers: { 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email, callbackUrl })
	});
	const answer = await Auth(request, { ...authConfig(), raw });
	if (answer.redirect?.includes('error=')) {
		console.error(`[auth] sign-in link request failed: ${answer.redirect}`);
	}
	await recordSignInEvent(access, {
		action: who.eligible ? 'signin.requested' : 'signin.refused',
		outcome: who.eligible ? 'success' : 'refused',
		userId: who.userId
	});
	return 'sent';
}
