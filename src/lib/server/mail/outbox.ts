import { NOTIFICATION_WORDS, type NotificationKind } from './notifications';
import type { Executor } from '../db';
import { outbox } from '../db/schema';

// Queueing a mail: features call `queueMail` inside the transaction of the change that
// causes it. The outbox worker (./worker.ts) delivers it; a trigger wakes the worker at once.

export interface QueuedMail {
	to: string;
	subject: string;
	text: string;
	html?: string | null;
	/** What kind of mail this is, e.g. `signin.link`, `invitation` (for support and tests). */
	kind: string;
}

export async function queueMail(executor: Executor, mail: QueuedMail): Promise<string> {
	const [row] = await executor
		.insert(outbox)
		.values({
			to: mail.to.toLowerCase(),
			subject: mail.subject,
			text: mail.text,
			html: mail.html ?? null,
			kind: mail.kind
		})
		.returning({ id: outbox.id });
	return row!.id;
}

export interface Notification {
	to: string;
	/** Where to look, e.g. `${ORIGIN}/referrals/…`: an address in Seamwell, never the content. */
	link: string;
	/** What kind of notification: it decides the subject and first line. */
	kind: NotificationKind;
}

/**
 * Queues a notification. Its words are fixed: that there is something to see, and a link.
 * Health details (measurements, findings, clearances, names of conditions) never travel by
 * mail; the reader signs in to see them.
 */
export async function queueNotification(
	executor: Executor,
	notification: Notification
): Promise<string> {
	const link = new URL(notification.link).toString();
	const words = NOTIFICATION_WORDS[notification.kind];
	return queueMail(executor, {
		to: notification.to,
		kind: notification.kind,
		subject: words.subject,
		text: [
			words.line,
			'',
			'Sign in to Seamwell to see it:',
			'',
			link,
			'',
			'This message holds no details on purpose: they stay in Seamwell.'
		].join('\n')
	});
}
