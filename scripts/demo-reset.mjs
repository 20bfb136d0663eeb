// `npm run demo:reset`: drops the database, migrates it again and loads the demo scenario.
// Works whether or not `npm start` is running (the app's pool reconnects by itself).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { loadEnv, root } from './lib/env.mjs';
import { isDatabaseUp } from './lib/postgres.mjs';
import { bringUpDatabase, defaultDataDir } from './lib/stack.mjs';
import { startFakes } from './lib/fakes.mjs';

if (!existsSync(join(root, '.env'))) {
	console.error('No .env yet: run `npm start` once first.');
	process.exit(1);
}
const env = loadEnv({ stack: true });
const dataDir = defaultDataDir(root, env);
const wasRunning = await isDatabaseUp(env);

const server = await bringUpDatabase(env, { dataDir, log: () => {} });
const admin = new pg.Client({ connectionString: env.DATABASE_SUPERUSER_URL });
await admin.connect();
await admin.query(`DROP DATABASE IF EXISTS "${env.DB_NAME}" WITH (FORCE)`);
await admin.end();
await bringUpDatabase(env, { dataDir, log: () => {} });

// The demo stores referral letters and documents in S3: start the fakes unless `npm start`
// already runs them.
const fakes = (await answers(`${env.S3_ENDPOINT}/`))
	? null
	: await startFakes(env, {
			s3Dir: join(root, '.data', 's3'),
			mailStore: join(root, '.data', 'mail.json'),
			log: () => {}
		});

const seeded = spawnSync('npx', ['tsx', 'scripts/demo.ts', '--if-empty'], {
	cwd: root,
	env,
	stdio: 'inherit'
});
await fakes?.stop();
if (!wasRunning) server.stop();
process.exit(seeded.status ?? 1);

async function answers(url) {
	try {
		await fetch(url, { signal: AbortSignal.timeout(1000) });
		return true;
	} catch {
		return false;
	}
}
