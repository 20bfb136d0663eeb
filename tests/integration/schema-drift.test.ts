import { spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { cpSync, readdirSync, rmSync } from 'node:fs';
import { afterAll, describe, expect, it } from 'vitest';

// The committed migrations must say everything the schema says: drizzle-kit, run against a
// copy of drizzle/, must find nothing left to migrate. (A schema edit without
// `npm run db:generate` fails here, before it can surprise a database.)
const copy = `.data/drift-${randomBytes(4).toString('hex')}`;

afterAll(() => rmSync(copy, { recursive: true, force: true }));

describe('schema and migrations', () => {
	it('agree: generating from the schema finds no change', () => {
		cpSync('drizzle', copy, { recursive: true });
		const before = readdirSync(copy);
		const run = spawnSync(
			'npx',
			[
				'drizzle-kit',
				'generate',
				'--dialect=postgresql',
				'--schema=./src/lib/server/db/schema/index.ts',
				`--out=./${copy}`
			],
			{ encoding: 'utf8' }
		);
		expect(run.status, run.stderr).toBe(0);
		expect(run.stdout).toContain('No schema changes');
		expect(readdirSync(copy)).toEqual(before);
	});
});
