import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { spawn } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { restartDelayMs, supervise } from './supervise.mjs';

// `npm start` keeps its children up: a child that dies is started again, with backoff.

const scratch = mkdtempSync(join(tmpdir(), 'seamwell-supervise-'));
afterEach(() => rmSync(join(scratch, 'runs'), { force: true }));

/** A child that appends a line per start and dies on its first two starts, then stays up. */
function flaky() {
	const runs = join(scratch, 'runs');
	const script = `
		const fs = require('node:fs');
		fs.appendFileSync(${JSON.stringify(runs)}, 'x');
		const n = fs.readFileSync(${JSON.stringify(runs)}, 'utf8').length;
		if (n <= 2) process.exit(3);
		setInterval(() => {}, 1000);
	`;
	return { runs, start: () => spawn(process.execPath, ['-e', script], { stdio: 'ignore' }) };
}

async function waitFor(done: () => boolean, timeoutMs = 15_000) {
	const deadline = Date.now() + timeoutMs;
	while (!done()) {
		if (Date.now() > deadline) throw new Error('timed out');
		await new Promise((r) => setTimeout(r, 20));
	}
}

describe('supervising a child of npm start', () => {
	it(
		'restarts a child that dies, says so, and stops it for good on stop()',
		{ timeout: 30_000 },
		async () => {
			const { runs, start } = flaky();
			const lines: string[] = [];
			const supervisor = supervise({
				name: 'mail fake',
				start,
				log: (line) => lines.push(line),
				startMs: 10,
				capMs: 40
			});
			const starts = () => {
				try {
					return readFileSync(runs, 'utf8').length;
				} catch {
					return 0;
				}
			};
			await waitFor(() => starts() === 3);
			expect(supervisor.restarts).toBe(2);
			expect(lines[0]).toMatch(/^The mail fake exited \(code 3\); restarting it in /);
			expect(lines[0]).toContain('The rest of the stack keeps running.');
			const last = supervisor.child;
			await supervisor.stop();
			expect(last.exitCode !== null || last.signalCode !== null).toBe(true);
			await new Promise((r) => setTimeout(r, 100));
			expect(starts()).toBe(3);
		}
	);

	it('backs off exponentially up to a cap', () => {
		expect([1, 2, 3, 4, 5, 6, 7].map((n) => restartDelayMs(n))).toEqual([
			1000, 2000, 4000, 8000, 16000, 30000, 30000
		]);
	});
});
