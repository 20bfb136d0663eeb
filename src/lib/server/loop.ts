import { briefError } from './db/errors';
import { sharedTransactions } from './db/scope';

// The one way Seamwell runs work in the background (the log sealer, the document sweeper, the
// review reminders, the outbox worker): one run at a time, again after `everyMs` (or sooner,
// when a run says so or someone wakes it), and an outage logged once — when it starts and when
// it ends — rather than on every tick. A run that throws never stops the loop.

export interface Loop {
	/** Runs now (or right after the run in progress), instead of waiting for the timer. */
	wake(): void;
	/** Whether the last run failed (the outbox's listener stays quiet during an outage). */
	readonly failing: boolean;
	/** No new run starts; resolves when the one in progress has finished. */
	stop(): Promise<void>;
}

export interface LoopOptions {
	/** How the log names it: "[audit] sealer". */
	name: string;
	everyMs: number;
	/** The first run's delay (default: at once). */
	firstInMs?: number;
	/** What the log says when it works again ("database reachable again"). */
	recovered?: string;
	log?: (line: string) => void;
	/** One run. It may return how long to wait for the next one (capped at `everyMs`). */
	run: () => Promise<number | void>;
}

export function startLoop(options: LoopOptions): Loop {
	const { name, everyMs, recovered = 'reachable again' } = options;
	const log = options.log ?? ((line: string) => console.error(line));
	let stopped = false;
	let failing = false;
	let again = false;
	let running: Promise<void> | null = null;
	let timer: NodeJS.Timeout | undefined;

	const schedule = (ms: number) => {
		clearTimeout(timer);
		if (!stopped) timer = setTimeout(wake, Math.min(ms, everyMs));
	};

	function wake() {
		if (stopped) return;
		if (running) {
			again = true;
			return;
		}
		clearTimeout(timer);
		// A run woken from inside a page's shared transaction must not join it (db/scope.ts).
		running = sharedTransactions
			.exit(async () => {
				do {
					again = false;
					let next = everyMs;
					try {
						next = (await options.run()) ?? everyMs;
						if (failing) log(`${name}: ${recovered}`);
						failing = false;
					} catch (error) {
						if (!failing) log(`${name}: ${briefError(error)}`);
						failing = true;
					}
					if (!again) schedule(next);
				} while (again && !stopped);
			})
			.finally(() => {
				running = null;
			});
	}

	if (options.firstInMs) schedule(options.firstInMs);
	else wake();

	return {
		wake,
		get failing() {
			return failing;
		},
		async stop() {
			stopped = true;
			clearTimeout(timer);
			await running;
		}
	};
}
