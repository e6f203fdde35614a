import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// LOOM_BUILD_DIR lets two checkouts' test runs build side by side without clashing.
		adapter: adapter({ out: process.env.LOOM_BUILD_DIR ?? 'build' }),
		// SvelteKit's origin check (CSRF) is on by default; no trustedOrigins are added.
		// Content-Security-Policy on every page (OWASP Content Security Policy Cheat Sheet):
		// SvelteKit adds a nonce for its own start-up script ('auto'); nothing is loaded from
		// another site; no site may frame the app (clickjacking). Styles keep 'unsafe-inline'
		// because Svelte writes style attributes (part positions, wire colours) as it renders.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'worker-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		},
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
