import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { startLoop } from './loop';

// The background loop under fake timers: time moves only when the test moves it.

describe('startLoop', () => {
	beforeEach(() => vi.useFakeTimers());
	afterEach(() => vi.useRealTimers());

	it('runs at once, then every interval, and an outage is logged once, with its end', async () => {
		const lines: string[] = [];
		let calls = 0;
		let down = false;
		const loop = startLoop({
			name: '[test] loop',
			everyMs: 1000,
			recovered: 'back',
			log: (line) => lines.push(line),
			run: async () => {
				calls++;
				if (down) throw new Error('connect ECONNREFUSED 127.0.0.1:5432');
			}
		});
		await vi.advanceTimersByTimeAsync(0);
		expect(calls).toBe(1);
		down = true;
		await vi.advanceTimersByTimeAsync(3000);
		expect(calls).toBe(4);
		expect(loop.failing).toBe(true);
		expect(lines).toHaveLength(1);
		expect(lines[0]).toMatch(/^\[test\] loop: /);
		down = false;
		await vi.advanceTimersByTimeAsync(1000);
		expect(lines).toEqual([lines[0], '[test] loop: back']);
		expect(loop.failing).toBe(false);
		await loop.stop();
		await vi.advanceTimersByTimeAsync(5000);
		expect(calls).toBe(5);
	});

	it('a wake during a run runs once more right after it; a run may ask to come back sooner', async () => {
		let calls = 0;
		let release!: () => void;
		const loop = startLoop({
			name: '[test] loop',
			everyMs: 60_000,
			firstInMs: 10,
			run: async () => {
				calls++;
				if (calls === 1) await new Promise<void>((r) => (release = r));
				return calls === 2 ? 500 : undefined;
			}
		});
		await vi.advanceTimersByTimeAsync(10);
		expect(calls).toBe(1);
		loop.wake();
		loop.wake();
		release();
		await vi.advanceTimersByTimeAsync(0);
		expect(calls).toBe(2); // the two wakes became one run
		await vi.advanceTimersByTimeAsync(500);
		expect(calls).toBe(3); // the run asked for 500 ms, not a minute
		await loop.stop();
	});

	it('stop waits for the run in progress', async () => {
		let finished = false;
		let release!: () => void;
		const loop = startLoop({
			name: '[test] loop',
			everyMs: 1000,
			run: async () => {
				await new Promise<void>((r) => (release = r));
				finished = true;
			}
		});
		await vi.advanceTimersByTimeAsync(0);
		const stopped = loop.stop();
		release();
		await stopped;
		expect(finished).toBe(true);
	});
});
