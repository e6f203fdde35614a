// GET /api/health from a server whose database cannot be reached: 503 with db "down".
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, describe, expect, it } from 'vitest';
import { baseUrl } from './helpers';

const port = Number(process.env.INTEGRATION_DOWN_PORT ?? 4189);
let server: ChildProcess | undefined;

afterAll(() => {
	server?.kill('SIGTERM');
});

describe('GET /api/health', () => {
	it('is up on the test server', async () => {
		const res = await fetch(`${baseUrl()}/api/health`);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ ok: true, db: 'up' });
	});

	it('answers 503 with db "down" when PostgreSQL is unreachable', async () => {
		// Port 9 on loopback (the old "discard" port) has nothing listening here: connections are refused.
		server = spawn('node', ['build'], {
			env: { ...process.env, PORT: String(port), ORIGIN: `http://localhost:${port}`, NODE_ENV: 'production', DATABASE_URL: 'postgres://loomwright@127.0.0.1:9/none' },
			stdio: 'ignore'
		});
		let res: Response | null = null;
		for (let i = 0; i < 100 && !res; i++) {
			res = await fetch(`http://localhost:${port}/api/health`).catch(() => null);
			if (!res) await new Promise((r) => setTimeout(r, 100));
		}
		expect(res!.status).toBe(503);
		expect(await res!.json()).toEqual({ ok: false, db: 'down' });
	});
});
