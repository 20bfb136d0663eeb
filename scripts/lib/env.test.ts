import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { STACK_KEYS, derivedKeys, loadEnv, recordStackSettings } from './env.mjs';

// `npm run audit:verify` and `npm run demo:reset` reach the services `npm start` runs, on the
// ports it was started with — also when those came from the environment, not from .env.

const scratch = mkdtempSync(join(tmpdir(), 'seamwell-env-'));
// The test runner's own environment names ports and URLs, and the environment wins: set it aside.
const saved = { ...process.env };
beforeAll(() => {
	for (const key of [...STACK_KEYS, ...derivedKeys, 'DB_APP_PASSWORD']) delete process.env[key];
});
afterAll(() => {
	process.env = saved;
	rmSync(scratch, { recursive: true, force: true });
});

describe('the ports npm start runs with', () => {
	it('are recorded by npm start and read by the scripts that work on its services', () => {
		const envFile = join(scratch, '.env');
		const stackFile = join(scratch, 'stack.json');
		writeFileSync(envFile, 'DB_APP_PASSWORD=secret\nPGPORT=54329\n');
		// `PGPORT=55432 PORT=3999 npm start`
		recordStackSettings(
			{ PGPORT: '55432', PORT: '3999', S3_PORT: '4999', DB_APP_PASSWORD: 'not recorded' },
			stackFile
		);
		const env = loadEnv({ file: envFile, stack: true, stackFile });
		expect(env.PGPORT).toBe('55432');
		expect(env.DATABASE_URL).toContain('@127.0.0.1:55432/');
		expect(env.ORIGIN).toBe('http://127.0.0.1:3999');
		expect(env.S3_ENDPOINT).toBe('http://127.0.0.1:4999');
		expect(env.DB_APP_PASSWORD).toBe('secret');
		// npm start itself reads only .env and the environment.
		expect(loadEnv({ file: envFile, stackFile }).PGPORT).toBe('54329');
	});
});
