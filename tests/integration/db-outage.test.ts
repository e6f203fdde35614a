// PostgreSQL going away and coming back, seen by an app server of its own that reaches the test
// database through a TCP relay in this file: the relay can refuse connections (database stopped)
// or take them and never answer (database frozen). While it is away every request is answered
// 503 with Retry-After within 2 s (RFC 9110 §15.6.4: 503 with Retry-After for a temporary
// overload or outage), JSON for the API and a page for pages; once it is back, requests succeed
// again within 1 s.
import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { person, type Person } from './people';

type Mode = 'up' | 'refuse' | 'frozen';
let mode: Mode = 'up';
const sockets = new Set<net.Socket>();
const target = new URL(process.env.DATABASE_URL!);
const relay = net.createServer((client) => {
	sockets.add(client);
	client.on('close', () => sockets.delete(client));
	client.on('error', () => {});
	if (mode === 'refuse') return client.destroy();
	if (mode === 'frozen') return; // taken, never answered
	const upstream = net.connect(Number(target.port || 5432), target.hostname);
	sockets.add(upstream);
	upstream.on('close', () => sockets.delete(upstream));
	upstream.on('error', () => client.destroy());
	client.on('error', () => upstream.destroy());
	client.pipe(upstream).pipe(client);
});

function cut(next: Mode) {
	mode = next;
	for (const s of sockets) s.destroy();
}

const port = Number(process.env.INTEGRATION_PORT ?? 4179) + 40;
const origin = `http://localhost:${port}`;
let server: ChildProcess;
let owner: Person;

beforeAll(async () => {
	await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', resolve));
	const relayPort = (relay.address() as net.AddressInfo).port;
	const url = new URL(process.env.DATABASE_URL!);
	url.hostname = '127.0.0.1';
	url.port = String(relayPort);
	server = spawn('node', [process.env.LOOM_BUILD_DIR ?? 'build'], {
		env: { ...process.env, DATABASE_URL: url.toString(), PORT: String(port), ORIGIN: origin, NODE_ENV: 'production', BODY_SIZE_LIMIT: '16M' },
		stdio: ['ignore', 'ignore', 'ignore']
	});
	const deadline = Date.now() + 30_000;
	for (;;) {
		const ok = await fetch(`${origin}/api/health`).then((r) => r.ok, () => false);
		if (ok) break;
		if (Date.now() > deadline) throw new Error('outage test server did not start');
		await new Promise((r) => setTimeout(r, 200));
	}
	owner = await person('Outage Owner');
}, 60_000);

afterAll(async () => {
	server?.kill('SIGTERM');
	cut('refuse');
	relay.close();
	await db.$client.end();
});

async function timed(path: string, accept: string) {
	const t0 = performance.now();
	const res = await fetch(origin + path, { headers: { cookie: owner.cookie, accept }, redirect: 'manual' });
	const text = await res.text();
	return { res, text, ms: performance.now() - t0 };
}

async function expectUnavailable() {
	for (const path of ['/api/vehicles', '/api/diagrams', '/api/palettes']) {
		const { res, text, ms } = await timed(path, 'application/json');
		expect(res.status, path).toBe(503);
		expect(ms, path).toBeLessThan(2000);
		expect(res.headers.get('retry-after'), path).toMatch(/^\d+$/);
		expect(res.headers.get('content-type'), path).toContain('application/json');
		expect(JSON.parse(text).error, path).toMatch(/cannot reach its database/);
	}
	for (const path of ['/garage', '/clubs', '/garage/__data.json']) {
		const { res, text, ms } = await timed(path, 'text/html');
		expect(res.status, path).toBe(503);
		expect(ms, path).toBeLessThan(2000);
		expect(res.headers.get('retry-after'), path).toMatch(/^\d+$/);
		if (!path.endsWith('.json')) expect(text, path).toContain('Back in a moment');
	}
	const health = await timed('/api/health', 'application/json');
	expect(health.res.status).toBe(503);
	expect(health.ms).toBeLessThan(2000);
}

async function expectRecoveryWithin(limitMs: number) {
	const t0 = performance.now();
	for (;;) {
		const { res } = await timed('/api/vehicles', 'application/json');
		if (res.status === 200) break;
		expect(performance.now() - t0, 'still unavailable').toBeLessThan(limitMs);
		await new Promise((r) => setTimeout(r, 50));
	}
	expect(performance.now() - t0).toBeLessThan(limitMs);
	expect((await timed('/garage', 'text/html')).res.status).toBe(200);
}

describe('the database away', () => {
	it('works through the relay before the outage', async () => {
		expect((await timed('/api/vehicles', 'application/json')).res.status).toBe(200);
		expect((await timed('/garage', 'text/html')).res.status).toBe(200);
	});

	it('stopped (connections refused): 503 with Retry-After within 2 s, then back within 1 s', async () => {
		cut('refuse');
		await expectUnavailable();
		mode = 'up';
		await expectRecoveryWithin(1000);
	}, 30_000);

	it('frozen (connections taken, never answered): 503 with Retry-After within 2 s, then back within 1 s', async () => {
		cut('frozen');
		await expectUnavailable();
		cut('up');
		await expectRecoveryWithin(1000);
	}, 60_000);
});
