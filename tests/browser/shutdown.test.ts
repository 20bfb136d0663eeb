import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { expect, test } from './support/test';

// A second app process from the same build, on a port of its own: on SIGTERM it finishes,
// stops its background workers, closes its database pool and exits by itself with code 0 —
// a deploy or a supervisor restart never has to fall back on SIGKILL.

function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const server = createServer();
		server.once('error', reject);
		server.listen(0, '127.0.0.1', () => {
			const { port } = server.address() as { port: number };
			server.close(() => resolve(port));
		});
	});
}

function exitOf(child: ChildProcess): Promise<{ code: number | null; signal: string | null }> {
	return new Promise((resolve) => {
		if (child.exitCode !== null || child.signalCode !== null) {
			resolve({ code: child.exitCode, signal: child.signalCode });
		} else child.once('exit', (code, signal) => resolve({ code, signal }));
	});
}

test('the app ends by itself on SIGTERM: workers stopped, pool closed, exit code 0', async () => {
	test.setTimeout(120_000);
	const buildDir = process.env.APP_BUILD_DIR;
	if (!buildDir) throw new Error('APP_BUILD_DIR is not set: run browser tests through `npm test`');
	const port = await freePort();
	const origin = `http://127.0.0.1:${port}`;
	const app = spawn(process.execPath, [buildDir], {
		env: { ...process.env, PORT: String(port), ORIGIN: origin },
		stdio: ['ignore', 'ignore', 'pipe']
	});
	let stderr = '';
	app.stderr!.on('data', (chunk) => (stderr += chunk));
	const exited = exitOf(app);
	try {
		// Up, and past its first database use (the workers start with the process).
		await expect
			.poll(
				async () => {
					if (app.exitCode !== null) throw new Error(`app exited early: ${stderr}`);
					return fetch(`${origin}/healthz`).then(
						(r) => r.status,
						() => 0
					);
				},
				{ timeout: 60_000 }
			)
			.toBe(200);
		expect((await fetch(`${origin}/signin`)).status).toBe(200);

		app.kill('SIGTERM');
		// Generous for a busy machine; before the fix the process never ended on its own.
		const ended = await Promise.race([
			exited,
			new Promise<null>((r) => setTimeout(() => r(null), 45_000))
		]);
		expect(ended, `still running 45 s after SIGTERM; stderr: ${stderr}`).toEqual({
			code: 0,
			signal: null
		});
	} finally {
		if (app.exitCode === null && app.signalCode === null) app.kill('SIGKILL');
	}
});
