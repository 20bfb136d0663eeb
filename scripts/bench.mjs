// `npm run bench`: throughput and latency of Seamwell's main paths as ratios against a bare
// Node.js HTTP server measured in the same run, on the same machine, with the same load —
// so the numbers mean something on any machine. Uses its own throwaway services.
import autocannon from 'autocannon';
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { rmSync } from 'node:fs';
import { createServer } from 'node:http';
import pg from 'pg';
import { root } from './lib/env.mjs';
import { startFakes, stopChild, waitForHttp } from './lib/fakes.mjs';
import { bringUpDatabase } from './lib/stack.mjs';
import { throwawayEnv } from './lib/throwaway.mjs';
import { join } from 'node:path';

const DURATION = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 20);
const log = (line) => console.log(`[bench] ${line}`);

const { env, scratch } = throwawayEnv({
	prefix: 'bench',
	ports: {
		PORT: process.env.BENCH_PORT ?? '3030',
		PGPORT: process.env.BENCH_PGPORT ?? '54399',
		S3_PORT: process.env.BENCH_S3_PORT ?? '4639',
		MAIL_SMTP_PORT: process.env.BENCH_MAIL_SMTP_PORT ?? '1095',
		MAIL_HTTP_PORT: process.env.BENCH_MAIL_HTTP_PORT ?? '1150'
	}
});
const buildDir = 'build-bench';
const cleanups = [];

try {
	const database = await bringUpDatabase(env, {
		dataDir: join(scratch, 'pg'),
		throwaway: true,
		log
	});
	cleanups.push(() => database.stop());
	const fakes = await startFakes(env, { s3Dir: join(scratch, 's3'), log });
	cleanups.push(() => fakes.stop());
	run('npx', ['vite', 'build', '--logLevel', 'error'], { BUILD_TAG: 'bench' });
	run('npx', ['tsx', 'scripts/demo.ts', '--reset-data']);
	const app = spawn(process.execPath, [buildDir], { cwd: root, env, stdio: 'ignore' });
	cleanups.push(() => stopChild(app));
	await waitForHttp(`${env.ORIGIN}/healthz`, 'app', app, 60_000);

	const baseline = await startBaseline();
	cleanups.push(() => new Promise((r) => baseline.server.close(r)));
	const cookie = await sessionCookieFor('instructor@studio.example');

	const targets = [
		{ name: 'bare Node.js server (baseline)', url: `${baseline.url}/` },
		{ name: 'landing page (SSR)', url: `${env.ORIGIN}/` },
		{ name: 'GET /api/v1/me (session lookup)', url: `${env.ORIGIN}/api/v1/me`, cookie },
		{
			name: 'GET /api/v1/clients (list + audit rows)',
			url: `${env.ORIGIN}/api/v1/clients?limit=25`,
			cookie
		}
	];
	const results = [];
	for (const target of targets) {
		log(`measuring ${target.name} …`);
		results.push({ ...target, ...(await measure(target)) });
	}
	report(results);
} finally {
	for (const step of cleanups.reverse()) await step();
	rmSync(scratch, { recursive: true, force: true });
	rmSync(join(root, buildDir), { recursive: true, force: true });
	rmSync(join(root, '.svelte-kit-bench'), { recursive: true, force: true });
}

function run(cmd, args, extraEnv = {}) {
	const result = spawnSync(cmd, args, {
		cwd: root,
		env: { ...env, ...extraEnv },
		stdio: 'inherit'
	});
	if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed`);
}

function startBaseline() {
	const server = createServer((_req, res) => {
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end('{"ok":true}');
	});
	return new Promise((resolve) =>
		server.listen(0, '127.0.0.1', () => {
			const { port } = /** @type {import('node:net').AddressInfo} */ (server.address());
			resolve({ server, url: `http://127.0.0.1:${port}` });
		})
	);
}

/** A database session for a demo person, made directly (the bench measures reads, not sign-in). */
async function sessionCookieFor(email) {
	const client = new pg.Client({ connectionString: env.DATABASE_URL });
	await client.connect();
	const token = randomBytes(32).toString('hex');
	await client.query(
		`insert into sessions (session_token, user_id, expires)
		 select $1, id, now() + interval '1 hour' from users where email = $2`,
		[token, email]
	);
	await client.end();
	return `authjs.session-token=${token}`;
}

async function measure({ url, cookie }) {
	const result = await autocannon({
		url,
		connections: CONNECTIONS,
		duration: DURATION,
		headers: cookie ? { cookie } : {}
	});
	const non2xx = result.non2xx + result.errors;
	return { rps: result.requests.average, p99: result.latency.p99, non2xx };
}

function report(results) {
	const base = results[0];
	console.log(`\nBenchmark: ${CONNECTIONS} connections, ${DURATION} s per target\n`);
	console.log(
		'target'.padEnd(42) +
			'req/s'.padStart(9) +
			'p99 ms'.padStart(9) +
			'vs baseline'.padStart(13) +
			'  errors'
	);
	for (const r of results) {
		const ratio = base.rps ? (r.rps / base.rps).toFixed(3) : 'n/a';
		console.log(
			r.name.padEnd(42) +
				r.rps.toFixed(0).padStart(9) +
				String(r.p99).padStart(9) +
				`${ratio}×`.padStart(13) +
				`  ${r.non2xx}`
		);
	}
	console.log('\nRatios compare throughput with the bare server measured in this same run.');
}
