// `npm run bench:js`: builds the app and prints the gzipped JavaScript each page loads (entry,
// its layouts and page, and every chunk they import statically), against the 60 KB target —
// the page-weight part of `npm run bench`, without its services. Code loaded on demand
// (a form's checks when it is sent) is not counted: the page does not load it.
import { spawnSync } from 'node:child_process';
import { rmSync } from 'node:fs';
import { join } from 'node:path';
import { root } from './lib/env.mjs';
import { pageJavaScript } from './lib/page-js.mjs';

const TARGET_KB = 60;
const tag = 'pagejs';
try {
	const built = spawnSync('npx', ['vite', 'build', '--logLevel', 'error'], {
		cwd: root,
		env: { ...process.env, BUILD_TAG: tag },
		stdio: 'inherit'
	});
	if (built.status !== 0) throw new Error('the build failed');
	const pages = pageJavaScript(join(root, `.svelte-kit-${tag}`)).sort((a, b) => b.kb - a.kb);
	for (const { route, kb } of pages) {
		console.log(
			`${kb.toFixed(1).padStart(6)} KB  ${kb <= TARGET_KB ? 'MET   ' : 'MISSED'}  ${route}`
		);
	}
	const over = pages.filter((p) => p.kb > TARGET_KB).length;
	console.log(`\n${pages.length} pages, ${over} over ${TARGET_KB} KB`);
} catch (error) {
	console.error(error instanceof Error ? error.message : error);
	process.exitCode = 1;
} finally {
	rmSync(join(root, `build-${tag}`), { recursive: true, force: true });
	rmSync(join(root, `.svelte-kit-${tag}`), { recursive: true, force: true });
}
