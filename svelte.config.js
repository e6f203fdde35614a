import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// LOOM_BUILD_DIR lets two checkouts' test runs build side by side without clashing.
		adapter: adapter({ out: process.env.LOOM_BUILD_DIR ?? 'build' }),
		// SvelteKit's origin check (CSRF) is on by default; no trustedOrigins are added.
		typescript: {
			// Type-check scripts, tests and config files along with the app.
			config: (tsconfig) => {
				tsconfig.include.push(
					'../scripts/**/*.ts',
					'../tests/**/*.ts',
					'../vite.config.ts',
					'../playwright.config.ts',
					'../drizzle.config.ts',
					'../tailwind.config.ts'
				);
				return tsconfig;
			}
		}
	}
};

export default config;
