// Keeps a child process running for `npm start`: when it dies on its own, it is started again
// after a pause that doubles with each quick failure (1 s, 2 s, 4 s … at most 30 s) and
// resets once the child has stayed up for a minute. Ctrl-C (stop()) ends it for good.

export const BACKOFF_START_MS = 1_000;
export const BACKOFF_CAP_MS = 30_000;
export const STABLE_AFTER_MS = 60_000;

/** The pause before restart number `restarts` (1-based) of a child that keeps failing. */
export function restartDelayMs(restarts, startMs = BACKOFF_START_MS, capMs = BACKOFF_CAP_MS) {
	return Math.min(capMs, startMs * 2 ** Math.max(0, restarts - 1));
}

/**
 * @param {{
 *   name: string,
 *   start: () => import('node:child_process').ChildProcess,
 *   ready?: (child: import('node:child_process').ChildProcess) => Promise<void>,
 *   log?: (line: string) => void,
 *   startMs?: number,
 *   capMs?: number,
 *   stableAfterMs?: number
 * }} options
 */
export function supervise({
	name,
	start,
	ready,
	log = console.log,
	startMs = BACKOFF_START_MS,
	capMs = BACKOFF_CAP_MS,
	stableAfterMs = STABLE_AFTER_MS
}) {
	let stopped = false;
	let restarts = 0;
	let timer;
	/** @type {import('node:child_process').ChildProcess} */
	let child;

	const launch = () => {
		const startedAt = Date.now();
		child = start();
		child.once('exit', (code, signal) => {
			if (stopped) return;
			if (Date.now() - startedAt >= stableAfterMs) restarts = 0;
			restarts++;
			const wait = restartDelayMs(restarts, startMs, capMs);
			const how = signal ? `signal ${signal}` : `code ${code}`;
			log(
				`The ${name} exited (${how}); restarting it in ${(wait / 1000).toFixed(1)} s (restart ${restarts}). The rest of the stack keeps running.`
			);
			timer = setTimeout(async () => {
				if (stopped) return;
				launch();
				if (ready) {
					try {
						await ready(child);
						log(`The ${name} is back.`);
					} catch {
						// Its exit handler schedules the next try.
					}
				}
			}, wait);
		});
		return child;
	};
	launch();

	return {
		get child() {
			return child;
		},
		get restarts() {
			return restarts;
		},
		/** Stops supervising and ends the child (SIGTERM, then SIGKILL after 5 s). */
		stop() {
			stopped = true;
			clearTimeout(timer);
			return new Promise((resolve) => {
				if (!child || child.exitCode !== null || child.signalCode) return resolve(undefined);
				const kill = setTimeout(() => child.kill('SIGKILL'), 5000);
				child.once('exit', () => {
					clearTimeout(kill);
					resolve(undefined);
				});
				child.kill('SIGTERM');
			});
		}
	};
}
