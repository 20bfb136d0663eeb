// Helpers for integration tests: they talk to the real services that scripts/test.mjs started.
import pg from 'pg';
import { randomUUID } from 'node:crypto';

export function requireEnv(name: string): string {
	const value = process.env[name];
	if (!value) throw new Error(`${name} is not set: run integration tests through \`npm test\``);
	return value;
}

/** A superuser connection, for what the app may never do (creating databases, tampering). */
export async function superuser(database = 'postgres'): Promise<pg.Client> {
	const url = new URL(requireEnv('DATABASE_SUPERUSER_URL'));
	url.pathname = `/${database}`;
	const client = new pg.Client({ connectionString: url.toString() });
	await client.connect();
	return client;
}

export interface InboxMessage {
	id: string;
	to: string[];
	subject: string;
	text: string;
	html: string | null;
	date: string;
}

/** Reads the mail fake's inbox for one address, newest first. */
export async function inbox(address: string): Promise<InboxMessage[]> {
	const base = requireEnv('MAIL_INBOX_URL');
	const res = await fetch(`${base}/api/messages?to=${encodeURIComponent(address)}`);
	if (!res.ok) throw new Error(`mail fake answered ${res.status}`);
	return (await res.json()) as InboxMessage[];
}

/** Waits until the inbox holds at least `count` messages for the address. */
export async function waitForMail(address: string, count = 1, timeoutMs = 10_000) {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const messages = await inbox(address);
		if (messages.length >= count) return messages;
		if (Date.now() > deadline) {
			throw new Error(`expected ${count} message(s) for ${address}, found ${messages.length}`);
		}
		await new Promise((r) => setTimeout(r, 100));
	}
}

export const uniqueAddress = (label = 'person') =>
	`${label}-${randomUUID().slice(0, 8)}@test.example`;
