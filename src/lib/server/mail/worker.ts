import { desc, eq, sql } from 'drizzle-orm';
import pg from 'pg';
import type { Database, Executor } from '../db';
import { briefError } from '../db/errors';
import { outbox } from '../db/schema';
import { SIGNIN_LINK_SECONDS } from '../people/sessions';
import { deliver, type SendMail } from './transport';
import { startLoop } from '../loop';

/** The mail that confirms an erasure, and what its address becomes once it is sent. */
export const ERASURE_CONFIRMATION_KIND = 'erasure.approved';
export const ERASED_ADDRESS = 'erased@invalid';

// The outbox worker: sends what queueMail wrote, through nodemailer.
//
// - Woken at once: a trigger NOTIFYs 'seamwell_outbox' when a row is inserted (at commit of
//   the transaction that queued it) and the worker LISTENs on a connection of its own; a poll
//   every `pollMs` (5 s) and a timer for the next retry cover a lost connection.
// - Claiming: one short statement picks due rows FOR UPDATE SKIP LOCKED and leases them
//   (attempts + 1, next_attempt_at = now() + lease). Two workers, in one process or two,
//   never claim the same row: the other's lock makes it skip the row, and once committed the
//   lease puts the row in the future. Sending happens outside any transaction; the result is
//   written afterwards (sent, or retry later, or failed).
// - Retries: after attempt n fails the row waits BACKOFF_BASE_MS × 2^(n−1) (5 s, 10 s, 20 s …,
//   at most 15 min), for RETRY_WINDOW_MS (48 h) from `retry_from` (when it was queued, or sent
//   again by an admin) — a mail server down over a weekend loses nothing. An attempt that fails
//   after the window ends the row `failed` with last_error; admins see it on their dashboard
//   and may send it again.
// - Sign-in links are worth sending only while they work: one still unsent after its lifetime
//   (10 min) ends `expired` instead of arriving late; one replaced by a newer link before it
//   was sent ends `superseded` (auth.ts).
// - Sent once: a mail is sent again only if the process dies (or loses the database for the
//   whole lease) after the SMTP server accepted it and before `sent` was recorded. SMTP has no
//   way to make that exactly-once, so the worker is at-least-once in that one case and
//   exactly-once otherwise; the Message-ID is the outbox id, so a duplicate is recognisable.
//   The lease (2 min) is far longer than one send can take (nodemailer's timeouts: ≤ 20 s).
// - Never crashes the process: database and SMTP errors are logged (once per outage) and
//   the next wake-up tries again.

export const RETRY_WINDOW_MS = 48 * 60 * 60_000;
export const BACKOFF_BASE_MS = 5_000;
export const BACKOFF_CAP_MS = 15 * 60_000;
export const LEASE_MS = 2 * 60_000;
export const OUTBOX_CHANNEL = 'seamwell_outbox';

/** The kind of the sign-in link mail, and how long its link works. */
export const SIGNIN_LINK_KIND = 'signin.link';
export const SIGNIN_LINK_MAX_AGE_MS = SIGNIN_LINK_SECONDS * 1000;

export interface OutboxSettings {
	send: SendMail;
	/** How long failed attempts are retried, from the row's `retry_from`. */
	retryWindowMs: number;
	/** A sign-in link mail older than this is dropped (`expired`), not sent. */
	signInLinkMaxAgeMs: number;
	backoffBaseMs: number;
	backoffCapMs: number;
	leaseMs: number;
	batchSize: number;
}

const defaults: OutboxSettings = {
	send: deliver,
	retryWindowMs: RETRY_WINDOW_MS,
	signInLinkMaxAgeMs: SIGNIN_LINK_MAX_AGE_MS,
	backoffBaseMs: BACKOFF_BASE_MS,
	backoffCapMs: BACKOFF_CAP_MS,
	leaseMs: LEASE_MS,
	batchSize: 10
};

/** The wait after the `attempt`-th failed attempt (1-based). */
export function backoffMs(attempt: number, baseMs = BACKOFF_BASE_MS, capMs = BACKOFF_CAP_MS) {
	return Math.min(capMs, baseMs * 2 ** Math.max(0, attempt - 1));
}

type ClaimedMail = {
	id: string;
	to: string;
	subject: string;
	text: string;
	html: string | null;
	attempts: number;
};

/** Leases up to `batchSize` due mails to this worker (one short transaction). */
export async function claimDue(
	database: Database,
	settings: Pick<OutboxSettings, 'batchSize' | 'leaseMs' | 'signInLinkMaxAgeMs'>
): Promise<ClaimedMail[]> {
	const result = await database.execute<ClaimedMail>(sql`
		update outbox set attempts = attempts + 1,
			next_attempt_at = now() + make_interval(secs => ${settings.leaseMs / 1000})
		where id in (
			select id from outbox
			where state = 'pending' and next_attempt_at <= now()
				and not (kind = ${SIGNIN_LINK_KIND}
					and created_at <= now() - make_interval(secs => ${settings.signInLinkMaxAgeMs / 1000}))
			order by next_attempt_at, created_at
			limit ${settings.batchSize}
			for update skip locked)
		returning id, "to", subject, text, html, attempts`);
	return result.rows;
}

/**
 * Sign-in links still unsent after their lifetime end `expired`: the link would no longer
 * work, so the mail is dropped rather than sent late.
 */
async function expireStaleSignInLinks(database: Database, maxAgeMs: number): Promise<number> {
	const result = await database.execute(sql`
		update outbox set state = 'expired',
			last_error = concat_ws(' / ', last_error, 'not delivered within the link''s 10 minutes: dropped, not sent late')
		where state = 'pending' and kind = ${SIGNIN_LINK_KIND}
			and created_at <= now() - make_interval(secs => ${maxAgeMs / 1000})`);
	return result.rowCount ?? 0;
}

async function withRetries<T>(work: () => Promise<T>, tries = 5, delayMs = 1000): Promise<T> {
	for (let attempt = 1; ; attempt++) {
		try {
			return await work();
		} catch (error) {
			if (attempt >= tries) throw error;
			await new Promise((r) => setTimeout(r, delayMs * attempt));
		}
	}
}

const errorText = (error: unknown) =>
	(error instanceof Error ? error.message : String(error)).slice(0, 500);

type Outcome = 'sent' | 'retry' | 'failed';

async function sendClaimed(
	database: Database,
	mail: ClaimedMail,
	settings: OutboxSettings
): Promise<Outcome> {
	// The row is ours while attempts still equals what we claimed with.
	const ours = sql`id = ${mail.id} and attempts = ${mail.attempts} and state = 'pending'`;
	try {
		await settings.send({
			id: mail.id,
			to: mail.to,
			subject: mail.subject,
			text: mail.text,
			html: mail.html
		});
	} catch (error) {
		const message = errorText(error);
		const wait = backoffMs(mail.attempts, settings.backoffBaseMs, settings.backoffCapMs);
		// Past the retry window this failure is the last; else wait and try again.
		const result = await withRetries(() =>
			database.execute<{ state: string }>(sql`
				update outbox set last_error = ${message},
					state = case when retry_from + make_interval(secs => ${settings.retryWindowMs / 1000}) <= now()
						then 'failed'::outbox_state else 'pending'::outbox_state end,
					next_attempt_at = now() + make_interval(secs => ${wait / 1000})
				where ${ours}
				returning state::text`)
		);
		return result.rows[0]?.state === 'failed' ? 'failed' : 'retry';
	}
	// Accepted by the SMTP server: record it, insisting, since a lost update means a resend.
	// The confirmation of an erasure is the last trace of the person's address: once it is
	// sent, the row forgets where it went (see privacy/erasure.ts).
	await withRetries(() =>
		database.execute(
			sql`update outbox set state = 'sent', sent_at = now(), last_error = null,
				"to" = case when kind = ${ERASURE_CONFIRMATION_KIND} then ${ERASED_ADDRESS} else "to" end
				where ${ours}`
		)
	);
	return 'sent';
}

export interface ProcessResult {
	sent: number;
	retry: number;
	failed: number;
	expired: number;
}

/** Sends every mail due now, batch after batch, and returns what happened. */
export async function processDue(
	database: Database,
	options: Partial<OutboxSettings> = {}
): Promise<ProcessResult> {
	const settings = { ...defaults, ...options };
	const result: ProcessResult = { sent: 0, retry: 0, failed: 0, expired: 0 };
	result.expired = await expireStaleSignInLinks(database, settings.signInLinkMaxAgeMs);
	for (;;) {
		const claimed = await claimDue(database, settings);
		const outcomes = await Promise.allSettled(
			claimed.map((mail) => sendClaimed(database, mail, settings))
		);
		for (const outcome of outcomes) {
			if (outcome.status === 'fulfilled') result[outcome.value]++;
			// A rejected one could not record its outcome; its lease brings it back later.
		}
		if (claimed.length < settings.batchSize) return result;
	}
}

/** How long until the next pending mail is due (ms), or null when none is pending. */
async function nextDueInMs(database: Database): Promise<number | null> {
	const result = await database.execute<{ wait: number | null }>(sql`
		select (extract(epoch from min(next_attempt_at) - now()) * 1000)::float8 as wait
		from outbox where state = 'pending'`);
	const wait = result.rows[0]?.wait;
	return wait === null || wait === undefined ? null : Math.max(0, Number(wait));
}

export interface OutboxWorkerOptions extends Partial<OutboxSettings> {
	database: Database;
	/** The longest the worker sleeps without a notification (ms). */
	pollMs?: number;
	log?: (line: string) => void;
}

export interface OutboxWorker {
	/** Looks for due mail now (notifications call this). */
	wake(): void;
	/** Resolves once the worker first listens for notifications (tests wait for it). */
	ready: Promise<void>;
	stop(): Promise<void>;
}

export function startOutboxWorker(options: OutboxWorkerOptions): OutboxWorker {
	const { database, pollMs = 5_000, log = (line: string) => console.error(line) } = options;
	const settings: OutboxSettings = { ...defaults };
	for (const key of Object.keys(defaults) as (keyof OutboxSettings)[]) {
		if (options[key] !== undefined) Object.assign(settings, { [key]: options[key] });
	}

	let stopped = false;
	// Sleeps until the next mail is due (at most `pollMs`), or until a notification wakes it.
	const loop = startLoop({
		name: '[mail] outbox worker',
		everyMs: pollMs,
		recovered: 'database reachable again',
		log,
		run: async () => {
			const result = await processDue(database, settings);
			if (result.failed > 0) {
				log(
					`[mail] ${result.failed} mail(s) failed for 48 hours and gave up (see the admin dashboard)`
				);
			}
			if (result.expired > 0) {
				log(
					`[mail] ${result.expired} sign-in link(s) not delivered in time: dropped, not sent late`
				);
			}
			return (await nextDueInMs(database)) ?? pollMs;
		}
	});
	const wake = () => loop.wake();

	// LISTEN on a connection of its own, reconnecting after a loss.
	let listener: pg.Client | null = null;
	let reconnect: NodeJS.Timeout | undefined;
	let listening!: () => void;
	const ready = new Promise<void>((resolve) => (listening = resolve));
	const listen = async () => {
		if (stopped) return;
		const client = new pg.Client(database.$client.options);
		listener = client;
		let lost = false;
		const onLost = (error?: Error) => {
			if (lost) return;
			lost = true;
			if (listener === client) listener = null;
			client.end().catch(() => {});
			if (stopped) return;
			if (error && !loop.failing) log(`[mail] outbox listener: ${briefError(error)}`);
			reconnect = setTimeout(() => void listen(), 2_000);
		};
		client.on('notification', () => wake());
		client.on('error', onLost);
		client.on('end', () => onLost());
		try {
			await client.connect();
			await client.query(`LISTEN ${OUTBOX_CHANNEL}`);
			listening();
			wake(); // whatever was queued while nobody listened
		} catch (error) {
			onLost(error instanceof Error ? error : new Error(String(error)));
		}
	};
	void listen();

	return {
		wake,
		ready,
		async stop() {
			stopped = true;
			clearTimeout(reconnect);
			const client = listener;
			listener = null;
			await client?.end().catch(() => {});
			await loop.stop();
		}
	};
}

/** Mail that gave up, newest first: for admins and support (no body, only what and why). */
export async function listFailedMail(executor: Executor, limit = 100) {
	return executor
		.select({
			id: outbox.id,
			to: outbox.to,
			kind: outbox.kind,
			attempts: outbox.attempts,
			lastError: outbox.lastError,
			createdAt: outbox.createdAt
		})
		.from(outbox)
		.where(eq(outbox.state, 'failed'))
		.orderBy(desc(outbox.createdAt))
		.limit(limit);
}
