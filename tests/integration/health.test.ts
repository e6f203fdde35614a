// GET /api/health from servers whose database cannot be reached: 503 with db "down", both when
// connections are refused and when the database port accepts but never answers.
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, type Server, type Socket } from 'node:net';
import { afterAll, describe, expect, it } from 'vitest';
import { baseUrl } from './helpers';

const children: ChildProcess[] = [];
const listeners: Server[] = [];
const sockets: Socket[] = [];

afterAll(() => {
	for (const c of children) c.kill('SIGTERM');
	for (const s of sockets) s.destroy();
	for (const l of listeners) l.close();
});

/** A loopback port the system has just handed out; nothing listens there once this returns. */
async function freePort(): Promise<number> {
	const probe = createServer();
	await new Promise<void>((r) => probe.listen(0, '127.0.0.1', r));
	const { port } = probe.address() as { port: number };
	await new Promise((r) => probe.close(r));
	return port;
}

/** Starts the built app against `databaseUrl`; resolves once it answers HTTP, with its port. */
async function startApp(databaseUrl: string): Promise<number> {
	const port = await freePort();
	const child = spawn('node', [process.env.LOOM_BUILD_DIR ?? 'build'], {
		env: { ...process.env, PORT: String(port), ORIGIN: `http://localhost:${port}`, NODE_ENV: 'production', DATABASE_URL: databaseUrl },
		stdio: ['ignore', 'ignore', 'pipe']
	});
	children.push(child);
	let stderr = '';
	child.stderr!.on('data', (d) => (stderr += d));
	const deadline = Date.now() + 25_000;
	for (;;) {
		if (child.exitCode !== null) throw new Error(`app server exited with ${child.exitCode}: ${stderr}`);
		const res = await fetch(`http://localhost:${port}/favicon.svg`).catch(() => null);
		if (res) return port;
		if (Date.now() > deadline) throw new Error(`app server did not listen on ${port} within 25 s: ${stderr}`);
		await new Promise((r) => setTimeout(r, 100));
	}
}

describe('GET /api/health', () => {
	it('is up on the test server', async () => {
		const res = await fetch(`${baseUrl()}/api/health`);
		expect(res.status).toBe(200);
		expect(await res.json()).toEqual({ ok: true, db: 'up' });
	});

	it('answers 503 with db "down" when PostgreSQL refuses connections', async () => {
		const port = await startApp(`postgres://loomwright@127.0.0.1:${await freePort()}/none`);
		const res = await fetch(`http://localhost:${port}/api/health`);
		expect(res.status).toBe(503);
		expect(await res.json()).toEqual({ ok: false, db: 'down' });
	});

	it('answers 503 with db "down" when the database port accepts but never answers', async () => {
		// A listener that takes connections and says nothing: the driver alone would wait 30 s.
		const silent = createServer((s) => sockets.push(s));
		listeners.push(silent);
		await new Promise<void>((r) => silent.listen(0, '127.0.0.1', r));
		const dbPort = (silent.address() as { port: number }).port;
		const port = await startApp(`postgres://loomwright@127.0.0.1:${dbPort}/none`);
		const t0 = Date.now();
		const res = await fetch(`http://localhost:${port}/api/health`);
		expect(res.status).toBe(503);
		expect(await res.json()).toEqual({ ok: false, db: 'down' });
		// Well before the driver's own 30 s connect time-out: the check gave up by itself.
		expect(Date.now() - t0).toBeLessThan(20_000);
	});
});
