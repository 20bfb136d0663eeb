// `npm test`: every check and every test, against throwaway services of its own on
// ports of their own (so it can run while `npm start` is up). Services are stopped also
// when a test fails; the exit code is non-zero on any failure.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { APP_NODE_FLAGS, root } from './lib/env.mjs';
import { startFakes, stopChild, waitForHttp } from './lib/fakes.mjs';
import { aptInstall } from './lib/postgres.mjs';
import { bringUpDatabase } from './lib/stack.mjs';
import { throwawayEnv } from './lib/throwaway.mjs';

const log = (line) => console.log(`[test] ${line}`);
// `npm test -- unit` runs one stage; any other argument filters test files, e.g.
// `npm test -- integration tests/integration/services.test.ts`; a browser file alone, e.g.
// `npm test -- tests/browser/no-js/flows.test.ts`, runs just the browser stage.
const STAGES = ['static', 'unit', 'integration', 'browser'];
const args = process.argv.slice(2);
const only = args.filter((a) => STAGES.includes(a));
const filters = args.filter((a) => !STAGES.includes(a));
// A file under tests/browser/ given without a stage runs the browser stage alone (vitest would
// find no such file and fail the unit and integration stages).
if (only.length === 0 && filters.length > 0 && filters.every((f) => f.startsWith('tests/browser/')))
	only.push('browser');
const want = (stage) => only.length === 0 || only.includes(stage);

const { env: testEnv, scratch } = throwawayEnv({
	prefix: 'test',
	ports: {
		PORT: process.env.TEST_PORT ?? '3010',
		PGPORT: process.env.TEST_PGPORT ?? '54339',
		S3_PORT: process.env.TEST_S3_PORT ?? '4579',
		MAIL_SMTP_PORT: process.env.TEST_MAIL_SMTP_PORT ?? '1035',
		MAIL_HTTP_PORT: process.env.TEST_MAIL_HTTP_PORT ?? '1090'
	}
});

// The browser stage's database-restart test stops and starts this cluster.
testEnv.PGDATA_DIR = join(scratch, 'pg');

const buildDir = process.env.BUILD_TAG ? `build-${process.env.BUILD_TAG}` : 'build';

const cleanups = [];
const results = [];
let failed = false;

async function cleanup() {
	for (const step of cleanups.reverse()) {
		try {
			await step();
		} catch (error) {
			console.error(error);
		}
	}
	rmSync(scratch, { recursive: true, force: true });
}
process.on('SIGINT', async () => {
	await cleanup();
	process.exit(130);
});

function stage(name, cmd, args, extraEnv = {}) {
	log(`▶ ${name}: ${cmd} ${args.join(' ')}`);
	const started = Date.now();
	const result = spawnSync(cmd, args, {
		cwd: root,
		env: { ...testEnv, ...extraEnv },
		stdio: 'inherit'
	});
	const ok = result.status === 0;
	results.push({ name, ok, seconds: ((Date.now() - started) / 1000).toFixed(1) });
	if (!ok) failed = true;
	return ok;
}

/**
 * Debian packages the tests use: chromium for the browser, poppler-utils to read PDFs back, qpdf
 * for the app's own PDF check (unit, integration and browser tests all upload or stamp PDFs).
 */
function ensureDebianPackages({ browser }) {
	const missing = [
		...(browser ? [['/usr/bin/chromium', 'chromium']] : []),
		['/usr/bin/pdftotext', 'poppler-utils'],
		['/usr/bin/qpdf', 'qpdf']
	].filter(([path]) => !existsSync(path));
	if (missing.length === 0) return;
	const names = missing.map(([, name]) => name);
	if (process.getuid?.() !== 0) {
		throw new Error(`Tests need Debian packages: sudo apt-get install -y ${names.join(' ')}`);
	}
	log(`Installing ${names.join(', ')} from Debian packages …`);
	aptInstall(names);
}

try {
	if (want('static')) {
		stage('format', 'npx', ['prettier', '--check', '.', '--log-level', 'warn']);
		stage('lint', 'npx', ['eslint', '.', '--max-warnings', '0']);
		stage('types', 'npm', ['run', '-s', 'check']);
		// Modules import one way: a cycle between server modules fails the run.
		stage('import cycles', 'npm', ['run', '-s', 'cycles']);
	}
	if (want('unit') || want('integration') || want('browser')) {
		ensureDebianPackages({ browser: want('browser') });
	}
	if (want('unit')) stage('unit', 'npx', ['vitest', 'run', '--project', 'unit', ...filters]);

	if (want('integration') || want('browser')) {
		const database = await bringUpDatabase(testEnv, {
			dataDir: testEnv.PGDATA_DIR,
			throwaway: true,
			log
		});
		cleanups.push(() => database.stop());
		const fakes = await startFakes(testEnv, { s3Dir: join(scratch, 's3'), log });
		cleanups.push(() => fakes.stop());

		if (want('integration'))
			stage('integration', 'npx', ['vitest', 'run', '--project', 'integration', ...filters]);

		if (want('browser')) {
			// The production build (as `npm start` runs it), not Svelte's development mode.
			if (
				stage('build', 'npx', ['vite', 'build', '--logLevel', 'warn'], { NODE_ENV: 'production' })
			) {
				stage('demo data', 'npx', ['tsx', 'scripts/demo.ts', '--reset-data']);
				const app = spawn(process.execPath, [...APP_NODE_FLAGS, buildDir], {
					cwd: root,
					env: testEnv,
					stdio: ['ignore', 'ignore', 'inherit']
				});
				cleanups.push(() => stopChild(app));
				await waitForHttp(`${testEnv.ORIGIN}/healthz`, 'app', app, 60_000);
				// The shutdown test starts a second app process from the same build.
				stage('browser', 'npx', ['playwright', 'test', ...filters], { APP_BUILD_DIR: buildDir });
			}
		}
	}
} catch (error) {
	failed = true;
	console.error(`[test] ${error instanceof Error ? error.message : error}`);
} finally {
	await cleanup();
}

console.log('\n[test] Summary');
for (const r of results) console.log(`  ${r.ok ? 'ok  ' : 'FAIL'} ${r.name} (${r.seconds} s)`);
const passed = results.filter((r) => r.ok).length;
console.log(`stages: ${passed} passed, ${results.length - passed} failed`);
process.exit(failed ? 1 : 0);
