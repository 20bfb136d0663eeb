import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { INPUT_CLASS, inputClass } from './styles';

// Forms and buttons take their look from the UI kit (./styles.ts, Field, Button), so it cannot
// drift from page to page. Checked over every Svelte file outside the kit.

function svelteFiles(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const path = join(dir, name);
		if (statSync(path).isDirectory()) return svelteFiles(path);
		return name.endsWith('.svelte') ? [path] : [];
	});
}

const files = svelteFiles('src')
	.filter((path) => !path.replaceAll('\\', '/').includes('lib/components/ui/'))
	.map((path) => ({ path, text: readFileSync(path, 'utf8') }));

/** Literal class attributes (no expression inside) on the elements the pattern names. */
function literalClasses(text: string, elements: string): string[] {
	const tag = new RegExp(`<(?:${elements})\\b(?:[^>"]|"[^"]*")*?\\sclass="([^"{]*)"`, 'g');
	return [...text.matchAll(tag)].map((m) => m[1]!);
}

const offenders = (test: (cls: string) => boolean, elements: string) =>
	files.flatMap(({ path, text }) =>
		literalClasses(text, elements)
			.filter(test)
			.map((cls) => `${path}: ${cls}`)
	);

describe('the UI kit', () => {
	it('every text input, select and text area takes INPUT_CLASS or inputClass()', () => {
		expect(offenders((cls) => cls.includes('border-sand-400'), 'input|select|textarea')).toEqual(
			[]
		);
	});

	it('no button or link restates the primary or secondary button', () => {
		const filled = (cls: string) =>
			/(^|\s)bg-tide-700(\s|$)/.test(cls) && cls.includes('text-white') && !cls.includes('sr-only');
		const outlined = (cls: string) =>
			/(^|\s)border-tide-700(\s|$)/.test(cls) && /(^|\s)px-\d/.test(cls);
		expect(offenders((cls) => filled(cls) || outlined(cls), 'button|a|summary|label')).toEqual([]);
	});
});

describe('inputClass', () => {
	it('adds utilities to the input look, an extra margin or width replacing the base one', () => {
		expect(inputClass('font-mono')).toBe(`${INPUT_CLASS} font-mono`);
		const narrow = inputClass('mt-0 w-24').split(' ');
		expect(narrow).toContain('mt-0');
		expect(narrow).toContain('w-24');
		expect(narrow).not.toContain('mt-1');
		expect(narrow).not.toContain('w-full');
		expect(narrow).toContain('border-sand-400');
	});
});
