import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

// The access log has one writer (./writer.ts) and no update or delete path anywhere in the
// code; its seals are appended by the sealer alone. Checked over every source file.

function sources(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return sources(path);
		return /\.(ts|js|mjs|svelte)$/.test(name) && !/\.test\.ts$/.test(name) ? [path] : [];
	});
}

const files = [...sources('src'), ...sources('scripts')].map((path) => ({
	path: relative('.', path),
	text: readFileSync(path, 'utf8')
}));

const writersOf = (pattern: RegExp) =>
	files.filter((f) => pattern.test(f.text)).map((f) => f.path.replaceAll('\\', '/'));

describe('the access log has one writer', () => {
	it('only the writer inserts rows', () => {
		expect(
			writersOf(
				/\.insert\(\s*accessLog\s*\)|insert\s+into\s+(\$\{accessLog\}|"?access_log"?(?!_))/i
			)
		).toEqual(['src/lib/server/audit/writer.ts']);
	});

	it('only the sealer appends seals', () => {
		expect(
			writersOf(/\.insert\(\s*accessLogSeals\s*\)|insert\s+into\s+"?access_log_seals"?/i)
		).toEqual(['src/lib/server/audit/sealer.ts']);
	});

	it('no code updates, deletes or truncates the log or its seals', () => {
		expect(
			writersOf(
				/\.(update|delete)\(\s*(accessLog|accessLogSeals)\s*\)|(update|delete\s+from|truncate)\s+"?access_log/i
			)
		).toEqual([]);
	});
});
