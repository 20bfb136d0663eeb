import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// BUILD_TAG lets several test runs build side by side (each into build-<tag>/).
		adapter: adapter({ out: process.env.BUILD_TAG ? `build-${process.env.BUILD_TAG}` : 'build' }),
		outDir: process.env.BUILD_TAG ? `.svelte-kit-${process.env.BUILD_TAG}` : '.svelte-kit',
		// SvelteKit hashes its own inline bootstrap script; nothing else may run inline.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				// Svelte writes a few inline style attributes (charts, transitions).
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		},
		// Absolute asset paths: the designed 404 page is also served in place of pages a person may
		// not see, at any depth, so its links to scripts and styles must not be relative.
		paths: { relative: false }
	}
};

export default config;
