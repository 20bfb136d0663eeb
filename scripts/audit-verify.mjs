// `npm run audit:verify [-- --seal]`: checks the access log's hash chain of the `npm start`
// database (settings from .env and the environment), through scripts/audit-verify.ts.
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { loadEnv, root } from './lib/env.mjs';

if (!existsSync(join(root, '.env')) && !process.env.DATABASE_URL) {
	console.error('No .env yet: run `npm start` once first.');
	process.exit(1);
}
const result = spawnSync('npx', ['tsx', 'scripts/audit-verify.ts', ...process.argv.slice(2)], {
	cwd: root,
	env: loadEnv({ stack: true }),
	stdio: 'inherit'
});
process.exit(result.status ?? 1);
