// `npm run bench`: Seamwell's speed at the scale of a large multi-site practice, against two
// baselines measured in the same run on the same machine with the same load, so the figures
// mean something anywhere: (a) a bare Node.js `http` server doing one indexed `pg` query (the
// machine's physical limit), (b) a bare SvelteKit endpoint in the same build doing the same
// query (the framework's own cost). Each target is printed with MET or MISSED. Its own
// throwaway services; not part of `npm test`. Exits non-zero only when it could not run.
//
// BENCH_SECONDS (default 5) per target, BENCH_CONNECTIONS (default 10), BENCH_ONLY (a regular
// expression: measure only the targets whose names match, besides the baselines).
// `npm run bench -- --hold` builds everything, then measures nothing: it writes the addresses,
// session cookies and ids to .bench-hold.json and keeps the services up until Ctrl-C, for
// profiling one target by hand (DEVELOPERS.md, "Profiling").
import autocannon from 'autocannon';
import { spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:http';
import { join } from 'node:path';
import pg from 'pg';
import { APP_NODE_FLAGS, root } from './lib/env.mjs';
import { startFakes, stopChild, waitForHttp } from './lib/fakes.mjs';
import { pageJavaScript } from './lib/page-js.mjs';
import { bringUpDatabase } from './lib/stack.mjs';
import { throwawayEnv } from './lib/throwaway.mjs';

const DURATION = Number(process.env.BENCH_SECONDS ?? 5);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 10);
const ONLY = process.env.BENCH_ONLY ? new RegExp(process.env.BENCH_ONLY, 'i') : null;
const HOLD = process.argv.includes('--hold');
const log = (line) => console.log(`[bench] ${line}`);

// The targets (issue of record: JSON ≥ 60 % of (b), SSR ≥ 40 %, p99 ≤ 50 ms, the log filter
// p97.5 ≤ 20 ms on 1 M rows, the export of 1 M rows under 200 MB peak RSS, ≤ 60 KB gzipped
// JavaScript per page, the app ready quickly once built).
const TARGET = {
	jsonShare: 0.6,
	ssrShare: 0.4,
	p99Ms: 50,
	logFilterP975Ms: 20,
	exportPeakRssMb: 200,
	pageJsKb: 60,
	startSeconds: 60
};

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
const kitDir = '.svelte-kit-bench';
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
	// A production build, as `npm start` makes: the throwaway env says NODE_ENV=test, which
	// would build Svelte's development mode (bigger, slower) and measure the wrong thing.
	run('npx', ['vite', 'build', '--logLevel', 'error'], {
		BUILD_TAG: 'bench',
		NODE_ENV: 'production'
	});
	run('npx', ['tsx', 'scripts/demo.ts', '--reset-data']);

	log('loading the scale dataset (generate_series) …');
	const seeded = Date.now();
	const sqlFile = (name) => readFileSync(join(root, 'scripts/lib', name), 'utf8');
	await withClient(env.DATABASE_OWNER_URL, (c) => c.query(sqlFile('scale-data.sql')));
	// Only the app's role may insert into the access log.
	await withClient(env.DATABASE_URL, (c) => c.query(sqlFile('scale-log.sql')));
	await withClient(env.DATABASE_OWNER_URL, (c) => c.query('analyze'));
	const counts = await withClient(env.DATABASE_URL, async (c) => {
		const r = await c.query(`select
			(select count(*) from organisations where kind = 'studio')::int as studios,
			(select count(*) from organisations where kind = 'clinic')::int as clinics,
			(select count(*) from clients)::int as clients,
			(select count(*) from screenings)::int as screenings,
			(select count(*) from referrals)::int as referrals,
			(select count(*) from access_log)::int as log_rows`);
		return r.rows[0];
	});
	log(`dataset ready in ${((Date.now() - seeded) / 1000).toFixed(0)} s: ${JSON.stringify(counts)}`);

	log('sealing and verifying the whole log …');
	const chain = JSON.parse(
		run('npx', ['tsx', 'scripts/bench-chain.ts'], {}, { capture: true }).trim().split('\n').at(-1)
	);

	const spawnedAt = Date.now();
	const app = spawn(process.execPath, [...APP_NODE_FLAGS, buildDir], {
		cwd: root,
		env: { ...env, NODE_ENV: 'production', SEAMWELL_BENCH: '1' },
		stdio: 'ignore'
	});
	cleanups.push(() => stopChild(app));
	await waitForHttp(`${env.ORIGIN}/healthz`, 'app', app, 60_000);
	const bootSeconds = (Date.now() - spawnedAt) / 1000;

	const ids = await withClient(env.DATABASE_URL, async (c) => {
		const one = async (text) => (await c.query(text)).rows[0].id;
		return {
			studio: await one(`select id from organisations where name = 'Bench studio 1'`),
			client: await one(`select c.id from clients c join organisations o on o.id = c.organisation_id
				where o.name = 'Bench studio 1' order by c.name limit 1`),
			referral: await one(`select r.id from referrals r join organisations o on o.id = r.clinic_id
				where o.name = 'Bench clinic 1' order by r.sent_at desc limit 1`),
			classClients: (
				await c.query(`select c.id from clients c join organisations o on o.id = c.organisation_id
					where o.name = 'Bench studio 1' order by c.name limit 20`)
			).rows.map((r) => r.id)
		};
	});
	const instructor = await sessionCookieFor('bench-instructor@bench.example');
	const admin = await sessionCookieFor('bench-admin@bench.example');
	const physio = await sessionCookieFor('bench-physio@bench.example');
	const planId = await createClassPlan(instructor, ids.classClients);
	const baseline = await startBaseline(ids.studio);
	cleanups.push(() => baseline.stop());

	const monthAgo = new Date(Date.now() - 30 * 86_400_000).toISOString();
	const weekAgo = new Date(Date.now() - 7 * 86_400_000).toISOString();
	const targets = [
		{ name: '(a) bare Node.js http + pg', url: `${baseline.url}/`, kind: 'baseline' },
		{
			name: '(b) bare SvelteKit endpoint + pg',
			url: `${env.ORIGIN}/bench/query?organisation=${ids.studio}`,
			kind: 'baseline'
		},
		{
			name: 'client list API',
			url: `${env.ORIGIN}/api/v1/clients?limit=25`,
			cookie: instructor,
			kind: 'json'
		},
		{
			name: "a client's screenings API",
			url: `${env.ORIGIN}/api/v1/clients/${ids.client}/screenings`,
			cookie: instructor,
			kind: 'json'
		},
		{
			name: 'physio inbox API',
			url: `${env.ORIGIN}/api/v1/referrals?limit=25`,
			cookie: physio,
			kind: 'json'
		},
		{
			name: 'plan check, 20-client class',
			url: `${env.ORIGIN}/api/v1/plans/${planId}/check`,
			cookie: instructor,
			kind: 'json'
		},
		{
			name: 'client page (SSR)',
			url: `${env.ORIGIN}/clients/${ids.client}`,
			cookie: instructor,
			kind: 'ssr'
		},
		{
			name: 'referral page (SSR)',
			url: `${env.ORIGIN}/referrals/${ids.referral}`,
			cookie: physio,
			kind: 'ssr'
		},
		{
			name: 'admin log, filtered by client',
			url: `${env.ORIGIN}/api/v1/audit?client=${ids.client}&limit=50`,
			cookie: admin,
			kind: 'json'
		},
		{
			name: 'admin log, a date range',
			url: `${env.ORIGIN}/api/v1/audit?from=${monthAgo}&to=${weekAgo}&limit=50`,
			cookie: admin,
			kind: 'json'
		},
		// The log filter's own latency: one admin filtering at a time (the 10-connection rows
		// above measure throughput under load).
		{
			name: 'admin log by client, one at a time',
			url: `${env.ORIGIN}/api/v1/audit?client=${ids.client}&limit=50`,
			cookie: admin,
			kind: 'latency',
			connections: 1
		},
		{
			name: 'admin log by dates, one at a time',
			url: `${env.ORIGIN}/api/v1/audit?from=${monthAgo}&to=${weekAgo}&limit=50`,
			cookie: admin,
			kind: 'latency',
			connections: 1
		}
	];
	if (HOLD) {
		const holdFile = join(root, '.bench-hold.json');
		cleanups.push(() => rmSync(holdFile, { force: true }));
		const cookies = { instructor, admin, physio };
		writeFileSync(
			holdFile,
			JSON.stringify({ env, appPid: app.pid, buildDir, cookies, ids, planId, targets }, null, 2)
		);
		log(`holding: ${holdFile} has the addresses, cookies and ids; Ctrl-C ends the hold`);
		await new Promise((resolve) => {
			process.once('SIGINT', resolve);
			process.once('SIGTERM', resolve);
		});
	} else {
		const measured = targets.filter((t) => t.kind === 'baseline' || !ONLY || ONLY.test(t.name));
		// The export first, on a freshly started app: its peak RSS is then the export's own.
		let exported = null;
		if (!ONLY || ONLY.test('csv export')) {
			log('exporting the whole log as CSV …');
			exported = await exportWholeLog(admin, app.pid);
		}
		const results = [];
		for (const target of measured) {
			log(`measuring ${target.name} …`);
			results.push({ ...target, ...(await measure(target)) });
		}
		const pages = pageJavaScript(join(root, kitDir));
		log(`raw: ${JSON.stringify({ results, exported, chain, bootSeconds })}`);
		report({ results, exported, chain, pages, bootSeconds, counts });
	}
} finally {
	for (const step of cleanups.reverse()) await step();
	rmSync(scratch, { recursive: true, force: true });
	rmSync(join(root, buildDir), { recursive: true, force: true });
	rmSync(join(root, kitDir), { recursive: true, force: true });
}

function run(cmd, args, extraEnv = {}, { capture = false } = {}) {
	const result = spawnSync(cmd, args, {
		cwd: root,
		env: { ...env, ...extraEnv },
		stdio: capture ? ['ignore', 'pipe', 'inherit'] : 'inherit',
		encoding: 'utf8',
		maxBuffer: 64 * 1024 * 1024
	});
	if (result.status !== 0) throw new Error(`${cmd} ${args.join(' ')} failed`);
	return result.stdout ?? '';
}

async function withClient(url, work) {
	const client = new pg.Client({ connectionString: url });
	await client.connect();
	try {
		return await work(client);
	} finally {
		await client.end();
	}
}

/** Baseline (a): Node's own http server, one pooled connection per load connection. */
function startBaseline(organisation) {
	const pool = new pg.Pool({ connectionString: env.DATABASE_URL, max: CONNECTIONS });
	const server = createServer(async (_req, res) => {
		const rows = await pool.query(
			'select id, name from clients where organisation_id = $1 order by name limit 25',
			[organisation]
		);
		res.writeHead(200, { 'content-type': 'application/json' });
		res.end(JSON.stringify(rows.rows));
	});
	return new Promise((resolve) =>
		server.listen(0, '127.0.0.1', () => {
			const { port } = /** @type {import('node:net').AddressInfo} */ (server.address());
			resolve({
				url: `http://127.0.0.1:${port}`,
				stop: async () => {
					await new Promise((r) => server.close(r));
					await pool.end();
				}
			});
		})
	);
}

/** A database session for a bench person, made directly (the bench measures reads, not sign-in). */
async function sessionCookieFor(email) {
	const token = randomBytes(32).toString('hex');
	await withClient(env.DATABASE_URL, (c) =>
		c.query(
			`insert into sessions (session_token, user_id, expires)
			 select $1, id, now() + interval '2 hours' from users where email = $2`,
			[token, email]
		)
	);
	return `authjs.session-token=${token}`;
}

/** The class the plan check measures: 20 clients, six exercises, through the real API. */
async function createClassPlan(cookie, clientIds) {
	const response = await fetch(`${env.ORIGIN}/api/v1/plans`, {
		method: 'POST',
		headers: { cookie, origin: env.ORIGIN, 'content-type': 'application/json' },
		body: JSON.stringify({
			title: 'Bench class',
			clientIds,
			exerciseIds: [
				'back-lying-breath-deep-core',
				'heel-slides',
				'single-toe-taps',
				'bent-knee-fall-outs',
				'leg-slides',
				'seated-breath-deep-core'
			]
		})
	});
	if (response.status !== 201) {
		throw new Error(`creating the bench plan: ${response.status} ${await response.text()}`);
	}
	return (await response.json()).id;
}

async function measure({ url, cookie, connections = CONNECTIONS }) {
	const result = await autocannon({
		url,
		connections,
		duration: DURATION,
		headers: cookie ? { cookie } : {}
	});
	return {
		rps: result.requests.average,
		p50: result.latency.p50,
		p975: result.latency.p97_5,
		p99: result.latency.p99,
		errors: result.non2xx + result.errors
	};
}

/** One CSV export of the admin's whole log, timed, with the app's peak RSS while it ran. */
async function exportWholeLog(cookie, pid) {
	const rss = () => {
		const status = readFileSync(`/proc/${pid}/status`, 'utf8');
		return Number(/VmRSS:\s+(\d+)/.exec(status)?.[1] ?? 0) / 1024;
	};
	const before = rss();
	let peak = before;
	const sampler = setInterval(() => {
		peak = Math.max(peak, rss());
	}, 20);
	const started = Date.now();
	const response = await fetch(`${env.ORIGIN}/api/v1/audit?format=csv`, { headers: { cookie } });
	let rows = -1; // the header line
	let bytes = 0;
	const decoder = new TextDecoder();
	for await (const chunk of response.body) {
		bytes += chunk.length;
		for (const c of decoder.decode(chunk, { stream: true })) if (c === '\n') rows++;
	}
	const seconds = (Date.now() - started) / 1000;
	clearInterval(sampler);
	peak = Math.max(peak, rss());
	return { status: response.status, rows, bytes, seconds, peakRssMb: peak, startRssMb: before };
}

function fmt(n, digits = 0) {
	return Number.isFinite(n) ? n.toFixed(digits) : 'n/a';
}
function verdict(ok) {
	return ok ? 'MET' : 'MISSED';
}

function report({ results, exported, chain, pages, bootSeconds, counts }) {
	const framework = results.find((r) => r.name.startsWith('(b)'));
	const physical = results.find((r) => r.name.startsWith('(a)'));
	const today = new Date().toISOString().slice(0, 10);
	console.log(
		`\nSeamwell benchmark, ${today}: ${CONNECTIONS} connections, ${DURATION} s a target; ` +
			`${counts.studios} studios, ${counts.clinics} clinics, ${counts.clients} clients, ` +
			`${counts.screenings} screenings, ${counts.referrals} referrals, ${counts.log_rows} log rows\n`
	);
	console.log(
		'| target | req/s | p50 ms | p97.5 ms | p99 ms | vs (b) | target | verdict |\n' +
			'| --- | ---: | ---: | ---: | ---: | ---: | --- | --- |'
	);
	for (const r of results) {
		const share = framework?.rps ? r.rps / framework.rps : NaN;
		let goal = '';
		let ok = true;
		if (r.kind === 'json' || r.kind === 'ssr') {
			const want = r.kind === 'json' ? TARGET.jsonShare : TARGET.ssrShare;
			goal = `≥ ${want * 100} % of (b), p99 ≤ ${TARGET.p99Ms} ms`;
			ok = share >= want && r.p99 <= TARGET.p99Ms;
		}
		if (r.kind === 'latency') {
			goal = `p97.5 ≤ ${TARGET.logFilterP975Ms} ms, 1 connection`;
			ok = r.p975 <= TARGET.logFilterP975Ms;
		}
		if (r.errors > 0) ok = false;
		console.log(
			`| ${r.name}${r.errors ? ` (${r.errors} errors)` : ''} | ${fmt(r.rps)} | ${r.p50} | ${r.p975} | ${r.p99} | ` +
				`${(r.kind === 'baseline' && r === physical) || r.kind === 'latency' ? '' : `${fmt(share * 100)} %`} | ${goal} | ${goal ? verdict(ok) : ''} |`
		);
	}
	const exportOk = exported?.status === 200 && exported.peakRssMb < TARGET.exportPeakRssMb;
	if (exported)
		console.log(
			`\nCSV export of the whole log: ${exported.rows} rows in ${fmt(exported.seconds, 1)} s ` +
				`(${fmt(exported.rows / exported.seconds)} rows/s, ${fmt(exported.bytes / 1048576, 1)} MB), ` +
				`peak RSS ${fmt(exported.peakRssMb)} MB (${fmt(exported.startRssMb)} MB before it) — target < ${TARGET.exportPeakRssMb} MB: ${verdict(exportOk)}`
		);
	console.log(
		`Seal chain: ${chain.sealed} rows sealed in ${fmt(chain.sealMs / 1000, 1)} s ` +
			`(${fmt(chain.sealed / (chain.sealMs / 1000))} rows/s); verify walk ${chain.verifyRowsPerSecond} rows/s over ${chain.rows} rows, ` +
			`${chain.intact ? 'intact' : 'BROKEN'}`
	);
	console.log(
		`App ready ${fmt(bootSeconds, 1)} s after start (built, migrated) — target ≤ ${TARGET.startSeconds} s: ${verdict(bootSeconds <= TARGET.startSeconds)}`
	);
	if (pages.length) {
		const heaviest = [...pages].sort((a, b) => b.kb - a.kb);
		const over = heaviest.filter((p) => p.kb > TARGET.pageJsKb);
		console.log(
			`JavaScript per page (gzipped, entry + nodes + chunks): heaviest ${heaviest
				.slice(0, 5)
				.map((p) => `${p.route} ${fmt(p.kb, 1)} KB`)
				.join(
					', '
				)}; lightest ${fmt(heaviest.at(-1).kb, 1)} KB — target ≤ ${TARGET.pageJsKb} KB: ` +
				`${verdict(over.length === 0)}${over.length ? ` (${over.length} of ${pages.length} pages over)` : ` (all ${pages.length} pages)`}`
		);
	}
	console.log('\nShares compare throughput with (b), measured in this same run.');
}
