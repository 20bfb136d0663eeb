// `npm start`: PostgreSQL, the S3 fake, the mail fake, migrations, demo data and the app,
// all on 127.0.0.1. `--dev` runs Vite's dev server instead of the production build.
// Ctrl-C stops everything; data stays in .data/ for the next start.
import { spawn, spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { ensureEnvFile, loadEnv, root } from './lib/env.mjs';
import { startFakes, stopChild, waitForHttp } from './lib/fakes.mjs';
import { ensureQpdfInstalled } from './lib/qpdf.mjs';
import { bringUpDatabase, defaultDataDir } from './lib/stack.mjs';

const dev = process.argv.includes('--dev');
const log = (line) => console.log(`[seamwell] ${line}`);

if (ensureEnvFile()) log('Wrote .env with freshly generated secrets (git-ignored).');
const env = loadEnv();

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

	const fakes = await startFakes(env, {
		s3Dir: join(root, '.data', 's3'),
		mailStore: join(root, '.data', 'mail.json'),
		log
	});
	cleanups.push(() => fakes.stop());

	runOrThrow('npx', ['tsx', 'scripts/demo.ts', '--if-empty'], env);

	let app;
	if (dev) {
		// Vite itself, not through npx: npx does not pass Ctrl-C's SIGTERM on to its child.
		const vite = join(root, 'node_modules', 'vite', 'bin', 'vite.js');
		app = spawn(
			process.execPath,
			[vite, 'dev', '--host', env.HOST, '--port', env.PORT, '--strictPort'],
			{
				cwd: root,
				env,
				stdio: 'inherit'
			}
		);
	} else {
		log('Building the app (vite build) …');
		runOrThrow('npx', ['vite', 'build', '--logLevel', 'warn'], env);
		app = spawn(process.execPath, ['build'], { cwd: root, env, stdio: 'inherit' });
	}
	cleanups.push(() => stopChild(app));
	app.on('exit', (code) => {
		if (!stopping) {
			console.error(`[seamwell] The app exited (code ${code}).`);
			shutdown(code ?? 1);
		}
	});
	await waitForHttp(`${env.ORIGIN}/healthz`, 'app', app, 120_000);
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

Sign in: open the app, enter one of these addresses, then open the link from the mail inbox.
${accounts.map((a) => `  ${a.email.padEnd(width)}  ${a.description}`).join('\n')}

Screening is not diagnosis: refer symptoms to a licensed health professional.
Press Ctrl-C to stop everything (data is kept in .data/).
`);
}
