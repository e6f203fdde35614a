import { defineConfig } from '@playwright/test';

const port = Number(process.env.E2E_PORT ?? 4180);
const origin = `http://localhost:${port}`;

// Debian's chromium, never a downloaded browser (scripts/test.sh installs it when missing).
export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: process.env.LOOM_TEST_OUT ? `${process.env.LOOM_TEST_OUT}/e2e-results` : '.data/test/e2e-results',
	timeout: 60_000,
	expect: { timeout: 10_000 },
	fullyParallel: false,
	workers: 1,
	retries: 0,
	use: {
		baseURL: origin,
		screenshot: 'only-on-failure',
		trace: 'retain-on-failure',
		launchOptions: {
			executablePath: '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--no-first-run'
			]
		}
	},
	webServer: {
		// Migrate and seed the e2e database, then serve the built app (exec: no wrapper left behind).
		command: 'node --import tsx scripts/migrate.ts && node --import tsx scripts/seed.ts && exec node ' + (process.env.LOOM_BUILD_DIR ?? 'build'),
		url: `${origin}/api/health`,
		reuseExistingServer: false,
		timeout: 120_000,
		stdout: 'ignore',
		stderr: 'pipe',
		env: {
			DATABASE_URL: process.env.E2E_DATABASE_URL ?? 'postgres://loomwright@127.0.0.1:54330/loomwright_e2e',
			PORT: String(port),
			ORIGIN: origin,
			NODE_ENV: 'production',
			LOOM_DEV_MAIL: '1',
			BODY_SIZE_LIMIT: '16M',
			SMTP_PORT: process.env.SMTP_PORT ?? '2625',
			MAIL_API_PORT: process.env.MAIL_API_PORT ?? '2626',
			S3_ENDPOINT: process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4669'
		}
	}
});
