import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	// Rolldown's plugin-timing report is noise in every build log.
	build: { rolldownOptions: { checks: { pluginTimings: false } } },
	server: { host: '127.0.0.1', port: Number(process.env.PORT ?? 3000), strictPort: true },
	test: {
		// Unit tests are pure; integration tests talk to the real services that
		// scripts/test.mjs starts, and share one database, so they run one file at a time.
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['src/**/*.test.ts', 'scripts/**/*.test.ts'],
					exclude: ['src/**/*.int.test.ts'],
					environment: 'node'
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['src/**/*.int.test.ts', 'tests/integration/**/*.test.ts'],
					environment: 'node',
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
