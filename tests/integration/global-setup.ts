// Integration tests run against the real PostgreSQL (a fresh database from scripts/test.sh) and
// the built app server, started here on its own port and stopped after the run.
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import type { TestProject } from 'vitest/node';

const port = Number(process.env.INTEGRATION_PORT ?? 4179);
const origin = `http://localhost:${port}`;
let server: ChildProcess | undefined;

declare module 'vitest' {
	export interface ProvidedContext {
		baseUrl: string;
	}
}

export async function setup(project: TestProject) {
	if (!process.env.DATABASE_URL) throw new Error('integration tests need DATABASE_URL (scripts/test.sh sets it)');
	execFileSync('node', ['--import', 'tsx', 'scripts/migrate.ts'], { stdio: 'inherit' });
	server = spawn('node', [process.env.LOOM_BUILD_DIR ?? 'build'], {
		// The server keeps idle connections longer than the test client does (undici drops its own
		// after 4 s), so the server never closes a socket the client is about to reuse (ECONNRESET).
		env: { ...process.env, PORT: String(port), ORIGIN: origin, NODE_ENV: 'production', LOOM_DEV_MAIL: '1', BODY_SIZE_LIMIT: '16M', KEEP_ALIVE_TIMEOUT: '65' },
		stdio: ['ignore', 'ignore', 'inherit']
	});
	const deadline = Date.now() + 30_000;
	for (;;) {
		try {
			const res = await fetch(`${origin}/api/health`);
			if (res.ok) break;
		} catch {
			// not listening yet
		}
		if (server.exitCode !== null) throw new Error(`app server exited with ${server.exitCode} (was it built? npm run build)`);
		if (Date.now() > deadline) throw new Error('app server did not answer /api/health within 30 s');
		await new Promise((r) => setTimeout(r, 200));
	}
	project.provide('baseUrl', origin);
}

export async function teardown() {
	server?.kill('SIGTERM');
}
