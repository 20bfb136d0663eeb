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
