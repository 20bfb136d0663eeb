// `npm start`: PostgreSQL, the S3 fake, the mail fake, migrations, demo data and the app,
// all on 127.0.0.1. `--dev` runs Vite's dev server instead of the production build.
// The app and the fakes are supervised: one that dies is started again (with backoff) while
// the rest keeps running. Ctrl-C stops everything; data stays in .data/ for the next start.
import { spawn, spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { APP_NODE_FLAGS, ensureEnvFile, loadEnv, recordStackSettings, root } from './lib/env.mjs';
import { mailReady, s3Ready, spawnMailFake, spawnS3Fake, waitForHttp } from './lib/fakes.mjs';
import { ensureQpdfInstalled } from './lib/qpdf.mjs';
import { supervise } from './lib/supervise.mjs';
import { bringUpDatabase, defaultDataDir } from './lib/stack.mjs';

const dev = process.argv.includes('--dev');
const log = (line) => console.log(`[seamwell] ${line}`);

if (ensureEnvFile()) log('Wrote .env with freshly generated secrets (git-ignored).');
const env = loadEnv();
// `npm run audit:verify` and `npm run demo:reset` read these, to reach the same services.
recordStackSettings(env);

const cleanups = [];
let stopping = false;
async function shutdown(code = 0) {
	if (stopping) return;
	stopping = true;
	log('Stopping …');
	for (const cleanup of cleanups.reverse()) {
		try {
			await cleanup();
		} catch (error) {
			console.error(error);
		}
	}
	process.exit(code);
}
process.on('SIGINT', () => shutdown(0));
process.on('SIGTERM', () => shutdown(0));

try {
	ensureQpdfInstalled(log);
	const database = await bringUpDatabase(env, { dataDir: defaultDataDir(root, env), log });
	cleanups.push(() => database.stop());

	const s3Dir = join(root, '.data', 's3');
	const mailStore = join(root, '.data', 'mail.json');
	const s3 = supervise({
		name: 'S3 fake',
		start: () => spawnS3Fake(env, { s3Dir }),
		ready: (child) => s3Ready(env, child),
		log
	});
	cleanups.push(() => s3.stop());
	const mail = supervise({
		name: 'mail fake',
		start: () => spawnMailFake(env, { mailStore }),
		ready: (child) => mailReady(env, child),
		log
	});
	cleanups.push(() => mail.stop());
	await Promise.all([s3Ready(env, s3.child), mailReady(env, mail.child)]);
	log(`S3 fake   ${env.S3_ENDPOINT} (bucket ${env.S3_BUCKET})`);
	log(`Mail fake smtp://127.0.0.1:${env.MAIL_SMTP_PORT}, inbox ${env.MAIL_INBOX_URL}`);

	runOrThrow('npx', ['tsx', 'scripts/demo.ts', '--if-empty'], env);

	let startApp;
	if (dev) {
		// Vite itself, not through npx: npx does not pass Ctrl-C's SIGTERM on to its child.
		const vite = join(root, 'node_modules', 'vite', 'bin', 'vite.js');
		startApp = () =>
			spawn(
				process.execPath,
				[vite, 'dev', '--host', env.HOST, '--port', env.PORT, '--strictPort'],
				{ cwd: root, env, stdio: 'inherit' }
			);
	} else {
		log('Building the app (vite build) …');
		runOrThrow('npx', ['vite', 'build', '--logLevel', 'warn'], env);
		startApp = () =>
			spawn(process.execPath, [...APP_NODE_FLAGS, 'build'], { cwd: root, env, stdio: 'inherit' });
	}
	const app = supervise({
		name: 'app',
		start: startApp,
		ready: (child) => waitForHttp(`${env.ORIGIN}/healthz`, 'app', child, 120_000),
		log
	});
	cleanups.push(() => app.stop());
	// The first start must succeed; afterwards a crash is restarted rather than fatal.
	await waitForHttp(`${env.ORIGIN}/healthz`, 'app', app.child, 120_000);
	printBanner();
} catch (error) {
	console.error(`[seamwell] ${error instanceof Error ? error.message : error}`);
	await shutdown(1);
}

function runOrThrow(cmd, args, childEnv) {
	const result = spawnSync(cmd, args, { cwd: root, env: childEnv, stdio: 'inherit' });
	if (result.status !== 0)
		throw new Error(`${cmd} ${args.join(' ')} failed (exit ${result.status})`);
}

function printBanner() {
	const accounts = JSON.parse(
		spawnSync('npx', ['tsx', 'scripts/demo.ts', '--accounts-json'], {
			cwd: root,
			env,
			encoding: 'utf8'
		}).stdout
	);
	const width = Math.max(...accounts.map((a) => a.email.length));
	console.log(`
Seamwell is up.

  App         ${env.ORIGIN}
  Mail inbox  ${env.MAIL_INBOX_URL}   (JSON: ${env.MAIL_INBOX_URL}/api/messages?to=ADDRESS)
  S3 fake     ${env.S3_ENDPOINT}   PostgreSQL 127.0.0.1:${env.PGPORT}

The app and the fakes restart by themselves if one of them stops (the output says so).
Sign in: open the app, enter one of these addresses, then open the link from the mail inbox.
${accounts.map((a) => `  ${a.email.padEnd(width)}  ${a.description}`).join('\n')}

Screening is not diagnosis: refer symptoms to a licensed health professional.
Press Ctrl-C to stop everything (data is kept in .data/).
`);
}
