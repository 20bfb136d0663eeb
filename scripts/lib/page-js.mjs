// The gzipped JavaScript each page of a build loads, for `npm run bench` and `npm run bench:js`.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

/**
 * The gzipped JavaScript each page loads: the client entry and the page's nodes (its layouts
 * and the page itself) with every chunk they import, read from the build's Vite manifest.
 */
export function pageJavaScript(kitDir) {
	const manifestPath = join(kitDir, 'output/client/.vite/manifest.json');
	const appPath = join(kitDir, 'generated/client-optimized/app.js');
	if (!existsSync(manifestPath) || !existsSync(appPath)) return [];
	const manifest = JSON.parse(readFileSync(manifestPath, 'utf8'));
	const clientDir = join(kitDir, 'output/client');
	const gz = new Map();
	const gzipped = (file) => {
		if (!gz.has(file)) gz.set(file, gzipSync(readFileSync(join(clientDir, file))).length);
		return gz.get(file);
	};
	const closure = (key, seen) => {
		const chunk = manifest[key];
		if (!chunk || seen.has(key)) return;
		seen.add(key);
		for (const next of [...(chunk.imports ?? [])]) closure(next, seen);
	};
	const keyOf = (suffix) => Object.keys(manifest).find((k) => k.endsWith(suffix));
	const entries = Object.keys(manifest).filter(
		(k) => manifest[k].isEntry && /(start|app)\.js$/.test(k)
	);
	// dictionary: { "/(app)/clients/[id]": [page, [layouts …]], … } in app.js.
	const app = readFileSync(appPath, 'utf8');
	const dictionary = /dictionary\s*=\s*(\{[\s\S]*?\n\s*\});/.exec(app)?.[1] ?? '{}';
	const routes = [...dictionary.matchAll(/"([^"]+)":\s*\[(~?-?\d+)(?:,\s*\[([^\]]*)\])?/g)];
	return routes.map(([, route, page, layouts]) => {
		const nodes = [
			0,
			...(layouts ?? '')
				.split(',')
				.map((n) => n.trim())
				.filter(Boolean)
				.map(Number),
			Math.abs(Number(page.replace('~', '')))
		];
		const seen = new Set();
		for (const entry of entries) closure(entry, seen);
		for (const node of new Set(nodes)) {
			const key = keyOf(`nodes/${Math.abs(node)}.js`);
			if (key) closure(key, seen);
		}
		const kb = [...seen].reduce((sum, key) => sum + gzipped(manifest[key].file), 0) / 1024;
		return { route, kb };
	});
}
