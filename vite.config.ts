import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	test: {
		projects: [
			{
				extends: true,
				test: {
					name: 'unit',
					include: ['src/**/*.spec.ts'],
					environment: 'node',
					// Generated-circuit checks run for seconds on a loaded 2-core machine; a time-out is
					// not what these tests measure (speed lives in npm run bench).
					testTimeout: 60_000,
					// beforeAll hooks plan whole diagnoses on the demo; a loaded 2-core machine needs the room.
					hookTimeout: 60_000
				}
			},
			{
				extends: true,
				test: {
					name: 'integration',
					include: ['tests/integration/**/*.test.ts'],
					environment: 'node',
					globalSetup: ['tests/integration/global-setup.ts'],
					// One database for the run: files take turns so counts stay predictable.
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
