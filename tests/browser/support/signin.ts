// Signing in through the real e-mail link, for every browser test: ask for a link, read it
// from the mail fake's inbox, open the confirmation page, press its button.
import { expect, type Page } from '@playwright/test';
import pg from 'pg';

const SIGNIN_SUBJECT = 'Your Seamwell sign-in link';

function requireEnv(name: string): string {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run browser tests through \`npm test\``);
	return value;
}

export interface InboxMessage {
	id: string;
	to: string[];
	subject: string;
	text: string;
	date: string;
}

/** The mail fake's messages for one address, newest first. */
export async function inbox(address: string): Promise<InboxMessage[]> {
	const res = await fetch(
		`${requireEnv('MAIL_INBOX_URL')}/api/messages?to=${encodeURIComponent(address)}`
	);
	if (!res.ok) throw new Error(`mail fake answered ${res.status}`);
	return (await res.json()) as InboxMessage[];
}

/** Waits for a mail with this subject beyond the `seen` ones already there; returns the newest. */
export async function waitForNewMail(
	address: string,
	subject: string,
	seen: number,
	timeoutMs = 10_000
): Promise<InboxMessage> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const matching = (await inbox(address)).filter((m) => m.subject.startsWith(subject));
		if (matching.length > seen) return matching[0]!;
		if (Date.now() > deadline) throw new Error(`no new "${subject}" mail for ${address}`);
		await new Promise((r) => setTimeout(r, 150));
	}
}

export async function countMail(address: string, subject = SIGNIN_SUBJECT): Promise<number> {
	return (await inbox(address)).filter((m) => m.subject.startsWith(subject)).length;
}

/** The first link to `path` in a mail's text. */
export function linkIn(message: InboxMessage, path: string): string {
	const match = message.text.match(new RegExp(`https?://\\S+${path.replace('/', '\\/')}\\S*`));
	if (!match) throw new Error(`no ${path} link in mail "${message.subject}"`);
	return match[0];
}

/** Runs SQL as the app's database role (tests move the clock by changing stored timestamps). */
export async function sql<T extends pg.QueryResultRow = pg.QueryResultRow>(
	text: string,
	values: unknown[] = []
): Promise<T[]> {
	const client = new pg.Client({ connectionString: requireEnv('DATABASE_URL') });
	await client.connect();
	try {
		return (await client.query<T>(text, values)).rows;
	} finally {
		await client.end();
	}
}

/**
 * Browser suites sign in far more often than a person does, all from 127.0.0.1: forget this
 * address's and the loopback's earlier sign-in requests so the limit does not trip them.
 * The limit itself is tested in tests/integration/rate-limit.test.ts.
 */
export async function forgetSignInRequests(email: string): Promise<void> {
	await sql(
		`delete from rate_limit_hits where (bucket = 'signin.email' and key = $1) or bucket = 'signin.ip'`,
		[email.toLowerCase()]
	);
}

/** Asks for a sign-in link on the sign-in page and returns the link from the mail. */
export async function requestSignInLink(page: Page, email: string): Promise<string> {
	await forgetSignInRequests(email);
	const seen = await countMail(email);
	await page.goto('/signin');
	// Pages opened with browser.newPage() lack the fixture's wait: wait for hydration here.
	await page.locator('html[data-hydrated]').waitFor({ state: 'attached' });
	await page.getByLabel('E-mail address').fill(email);
	await page.getByRole('button', { name: 'Send me a sign-in link' }).click();
	await expect(page).toHaveURL(/\/signin\/sent$/);
	await expect(page.getByRole('heading', { name: 'Check your inbox' })).toBeVisible();
	const mail = await waitForNewMail(email, SIGNIN_SUBJECT, seen);
	return linkIn(mail, '/signin/confirm');
}

/** Signs in as `email` through the real mail link; resolves on the page she lands on. */
export async function signIn(page: Page, email: string): Promise<void> {
	const link = await requestSignInLink(page, email);
	await page.goto(link);
	await page.getByRole('button', { name: 'Sign in to Seamwell' }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
	// On a phone the sign-out button sits in the closed menu: signed in means it is on the page.
	await expect(
		page.getByRole('button', { name: 'Sign out', includeHidden: true }).first()
	).toBeAttached();
}
