// `npm run db:migrate`: applies the committed migrations to the database `npm start` runs
// (started here if it is not running, and left as it was found). `npm start` and `npm test`
// migrate by themselves; this is for a database kept running while a migration is written.
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { loadEnv, root } from './lib/env.mjs';
import { isDatabaseUp } from './lib/postgres.mjs';
import { bringUpDatabase, defaultDataDir } from './lib/stack.mjs';

if (!existsSync(join(root, '.env'))) {
	console.error('No .env yet: run `npm start` once first.');
	process.exit(1);
}
const env = loadEnv({ stack: true });
const wasRunning = await isDatabaseUp(env);
const server = await bringUpDatabase(env, { dataDir: defaultDataDir(root, env) });
if (!wasRunning) server.stop();
console.log('Migrations applied.');
