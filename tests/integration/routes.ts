// Every page, form action and endpoint the code defines, found by walking src/routes: the
// authorization matrix checks each has a row; the hostile-input suite sends each bad input.
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const ROUTES = 'src/routes';

export interface Endpoint {
	route: string;
	call: string;
}

/** Every page (GET), form action (POST ?/name) and endpoint method the code defines. */
export function discoverEndpoints(dir = ROUTES): Endpoint[] {
	const found: Endpoint[] = [];
	for (const name of readdirSync(dir)) {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) {
			found.push(...discoverEndpoints(path));
			continue;
		}
		const route = '/' + relative(ROUTES, dir).split('\\').join('/');
		const id = route === '/' ? '/' : route.replace(/\/$/, '');
		const source = () => readFileSync(path, 'utf8');
		if (name === '+page.svelte') found.push({ route: id, call: 'GET' });
		if (name === '+page.server.ts' || name === '+page.server.js') {
			for (const action of actionNames(source()))
				found.push({ route: id, call: `POST ?/${action}` });
		}
		if (name === '+server.ts' || name === '+server.js') {
			const methods = source().matchAll(
				/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g
			);
			for (const [, method] of methods) found.push({ route: id, call: method! });
		}
	}
	return found;
}

/**
 * The keys of `export const actions = { … }`, read from the source: the object's own text
 * (nested brackets left out) split at its top-level commas, each piece's leading name.
 */
function actionNames(code: string): string[] {
	const source = code.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');
	const start = source.search(/export\s+const\s+actions\b/);
	if (start < 0) return [];
	const open = source.indexOf('{', source.indexOf('=', start));
	let depth = 0;
	let own = '';
	for (let i = open; i < source.length; i++) {
		const c = source[i]!;
		if ('{[('.includes(c)) depth++;
		if (depth === 1 && i > open) own += c;
		if ('}])'.includes(c)) depth--;
		if (depth === 0) break;
	}
	return own
		.split(',')
		.map((piece) => piece.match(/^\s*(?:async\s+)?([A-Za-z_$][\w$]*)\s*[:(]/)?.[1])
		.filter((name): name is string => Boolean(name));
}
