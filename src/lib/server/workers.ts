import { startSealer } from './audit/sealer';
import { startReviewReminders } from './clearance/reviews';
import { db } from './db';
import { startDocumentSweeper } from './documents/sweeper';
import { startOutboxWorker } from './mail/worker';
import { sendPracticeReminders } from './self-care/service';
import { s3AnchorStore } from './storage/anchors';

let running: (() => Promise<void>) | undefined;

/**
 * Starts the background work of one app process: the mail outbox worker, the access log's
 * sealer and the sweeper of orphaned document objects. Several processes may each run them:
 * the outbox claims rows with FOR UPDATE SKIP LOCKED and the sealer is elected by an advisory
 * lock; review reminders are claimed row by row. None throws when the database, S3 or the
 * SMTP server is down; they log and try again. Returns a function that stops them all and
 * resolves once their work in progress has finished.
 */
export function startBackgroundWorkers(): () => Promise<void> {
	// Started once per process, even if the init hook runs again (dev server reloads).
	if (running) return running;
	const database = db();
	const outbox = startOutboxWorker({ database });
	// The sealer also anchors the chain's head in the anchor bucket as it moves.
	const sealer = startSealer(database, { anchors: s3AnchorStore });
	// Deleting an orphan twice is harmless, so several processes may sweep side by side.
	const sweeper = startDocumentSweeper(database);
	// Each reminder is claimed by an UPDATE … WHERE reminder_sent_at IS NULL: sent once.
	// Practice reminders are claimed by moving their due day on in the same UPDATE: sent once.
	const reminders = startReviewReminders(database, { also: sendPracticeReminders });
	let stopping: Promise<void> | undefined;
	const stop = () => {
		stopping ??= Promise.all([outbox.stop(), sealer.stop(), sweeper.stop(), reminders.stop()]).then(
			() => {
				running = undefined;
			}
		);
		return stopping;
	};
	running = stop;
	return stop;
}
