import { defineConfig } from '@playwright/test';

// Browser tests run against the built app that scripts/test.mjs starts (ORIGIN), in Debian's
// chromium — nothing downloads a browser.
export default defineConfig({
	testDir: 'tests/browser',
	outputDir: 'test-results',
	// Generous: the suite must pass on a busy 2-core machine; tests wait for states, not times.
	timeout: 90_000,
	expect: { timeout: 15_000 },
	fullyParallel: false,
	workers: 1,
	reporter: [['list']],
	// The suite as a person meets it, then the main forms again with scripts switched off
	// (tests/browser/no-js/): every form must work as a plain HTML post.
	projects: [
		{ name: 'browser', testIgnore: 'no-js/**' },
		{ name: 'no-js', testMatch: 'no-js/**/*.test.ts', use: { javaScriptEnabled: false } }
	],
	use: {
		baseURL: process.env.ORIGIN ?? 'http://127.0.0.1:3010',
		screenshot: 'only-on-failure',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--headless',
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync'
			]
		}
	}
});
