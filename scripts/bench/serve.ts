/**
 * End to end: probe plans as a client gets them, through an HTTP server in this process that
 * answers with the app's own handler (planning/pool.ts in its worker threads, the API's answer of
 * planning/probe-plan.ts, gzip as hooks.server.ts sends it), without the database and access checks.
 *
 * 1. Generated harnesses of 50, 200, 400, 800 and 1,600 parts, BENCH_SERVE_CASES (default 5) each:
 *    a planted fault, the marks a person would see (testing/worlds.ts marksSeen), one request each;
 *    median and worst time, the answer's size as sent (gzip) and unpacked, the 503s and why.
 * 2. The demo harness with 20 clients at once, each with the marks of another planted fault,
 *    three plans each, while another client GETs the demo drawing every 50 ms.
 *
 * Targets (the engine-scale issue, two cores): median ≤ 1 s and worst ≤ 3 s at 400 parts, median
 * ≤ 3 s at 1,600; answer ≤ 200 kB; 20 at once p95 ≤ 500 ms; the GETs beside them p95 < 100 ms.
 */
import { createServer, type IncomingMessage, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { availableParallelism, loadavg } from 'node:os';
import { gzipSync } from 'node:zlib';
import { buildCircuit } from '../../src/lib/circuit/circuit';
import { demoHarness } from '../../src/lib/circuit/demo';
import type { DiagnoseInput } from '../../src/lib/circuit/diagnose';
import { generateHypotheses } from '../../src/lib/circuit/faults';
import { defaultScenario } from '../../src/lib/circuit/scenario';
import { solveCircuit } from '../../src/lib/circuit/solve';
import { generateHarness, prng } from '../../src/lib/circuit/testing/generate';
import { marksSeen } from '../../src/lib/circuit/testing/worlds';
import type { HarnessDocument } from '../../src/lib/circuit/schema';
import type { Scenario } from '../../src/lib/circuit/scenario';
import { ServiceUnavailable } from '../../src/lib/server/http';
import { closePlanning, probePlanned, threadCount } from '../../src/lib/server/planning/pool';

const quantile = (xs: number[], q: number) => {
	const s = [...xs].sort((a, b) => a - b);
	return s.length ? s[Math.min(s.length - 1, Math.floor(q * s.length))] : NaN;
};
const kB = (n: number) => `${(n / 1024).toFixed(0)} kB`;

interface Case {
	name: string;
	input: DiagnoseInput;
}

/** A planted single fault and the marks it shows; null when nothing a person would notice. */
function plantedCase(name: string, doc: HarnessDocument, scenario: Scenario, seed: number): Case | null {
	const c = buildCircuit(doc, scenario);
	const healthy = solveCircuit(c);
	const r = prng(seed);
	const faults = generateHypotheses(c).filter((h) => h.kind !== 'none');
	for (let tries = 0; tries < 20; tries++) {
		const planted = r.pick(faults);
		const marks = marksSeen(c, healthy, planted.changes);
		if (marks.some((m) => m.mark !== 'normal')) return { name: `${name}, ${planted.id}`, input: { doc, scenario, marks } };
	}
	return null;
}

/** The app's answer as the route sends it: JSON, gzip when asked, 503 with its reason. */
async function answer(cases: Case[], req: IncomingMessage, res: ServerResponse, demoJson: string): Promise<void> {
	const send = (status: number, body: string) => {
		const gz = /gzip/.test(req.headers['accept-encoding'] ?? '');
		const bytes = gz ? gzipSync(body) : Buffer.from(body);
		res.writeHead(status, { 'content-type': 'application/json', 'content-length': String(bytes.length), ...(gz ? { 'content-encoding': 'gzip' } : {}), 'x-unpacked': String(Buffer.byteLength(body)) });
		res.end(bytes);
	};
	if (req.method === 'GET') return send(200, demoJson);
	const i = Number(req.url?.split('/').pop());
	try {
		send(200, JSON.stringify(await probePlanned(cases[i].input, 1)));
	} catch (e) {
		send(e instanceof ServiceUnavailable ? 503 : 500, JSON.stringify({ error: e instanceof Error ? e.message : String(e) }));
	}
}

async function timed(url: string, init?: RequestInit): Promise<{ ms: number; status: number; sent: number; unpacked: number; error?: string }> {
	const t = performance.now();
	const res = await fetch(url, { ...init, headers: { 'accept-encoding': 'gzip' } });
	const body = await res.text();
	const ms = performance.now() - t;
	const sent = Number(res.headers.get('content-length') ?? 0);
	return { ms, status: res.status, sent, unpacked: Number(res.headers.get('x-unpacked') ?? body.length), error: res.ok ? undefined : JSON.parse(body).error };
}

export async function run(): Promise<void> {
	const perSize = Number(process.env.BENCH_SERVE_CASES) || 5;
	const sizes = (process.env.BENCH_SERVE_SIZES ?? '50,200,400,800,1600').split(',').map(Number);
	const cases: Case[] = [];
	const bySize = new Map<number, number[]>();
	for (const size of sizes) {
		const picked: number[] = [];
		for (let seed = 0; picked.length < perSize && seed < perSize * 4; seed++) {
			const { doc, scenario } = generateHarness(9100 + size * 10 + seed, { parts: size, crossLinks: 0.05, floating: 0.02 });
			const c = plantedCase(`${size} parts (seed ${9100 + size * 10 + seed})`, doc, scenario, seed + 1);
			if (!c) continue;
			picked.push(cases.length);
			cases.push(c);
		}
		bySize.set(size, picked);
	}
	const demo = demoHarness();
	const demoScenario = defaultScenario(demo);
	const crowd: number[] = [];
	for (let seed = 1; crowd.length < 20 && seed < 200; seed++) {
		const c = plantedCase(`demo ${seed}`, demo, demoScenario, 500 + seed);
		if (!c) continue;
		crowd.push(cases.length);
		cases.push(c);
	}
	const demoJson = JSON.stringify(demo);
	const server = createServer((req, res) => {
		req.resume();
		req.on('end', () => void answer(cases, req, res, demoJson));
	});
	await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
	const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
	console.log(`${threadCount()} planning thread(s) on ${availableParallelism()} cores; load average ${loadavg()[0].toFixed(1)}`);

	// Warm the thread (its first plan loads the circuit core).
	await timed(`${origin}/plan/${crowd[0]}`, { method: 'POST' });

	console.log('\none request at a time, generated harnesses (a planted fault each):');
	console.log('parts   cases   median     worst   largest answer sent (unpacked)   503s');
	for (const size of sizes) {
		const got = [];
		for (const i of bySize.get(size)!) got.push({ ...(await timed(`${origin}/plan/${i}`, { method: 'POST' })), name: cases[i].name });
		const ok = got.filter((g) => g.status === 200);
		const ms = got.map((g) => g.ms);
		const largest = ok.reduce((a, g) => (g.sent > a.sent ? g : a), { sent: 0, unpacked: 0 });
		console.log(
			`${String(size).padStart(5)}   ${String(got.length).padStart(5)}   ${(quantile(ms, 0.5) / 1000).toFixed(2).padStart(5)} s   ${(Math.max(...ms) / 1000).toFixed(2).padStart(5)} s   ${kB(largest.sent).padStart(8)} (${kB(largest.unpacked)})`.padEnd(74) +
				`${got.length - ok.length}`
		);
		for (const g of got.filter((g) => g.status !== 200)) console.log(`        ${g.name}: ${g.status} after ${(g.ms / 1000).toFixed(1)} s, ${g.error}`);
	}

	console.log(`\n20 clients at once on the demo harness (${demo.parts.length} parts), 3 plans each, each client its own planted fault; a GET of the drawing every 50 ms beside them:`);
	const gets: number[] = [];
	let stop = false;
	const getter = (async () => {
		while (!stop) {
			gets.push((await timed(`${origin}/diagram`)).ms);
			await new Promise((r) => setTimeout(r, 50));
		}
	})();
	const t0 = performance.now();
	const plans = (await Promise.all(crowd.map(async (i) => { const out = []; for (let k = 0; k < 3; k++) out.push(await timed(`${origin}/plan/${i}`, { method: 'POST' })); return out; }))).flat();
	const wall = performance.now() - t0;
	stop = true;
	await getter;
	const ms = plans.map((p) => p.ms);
	console.log(`  ${plans.length} plans in ${(wall / 1000).toFixed(1)} s: ${((plans.length * 1000) / wall).toFixed(1)} plans/s, p50 ${(quantile(ms, 0.5) / 1000).toFixed(2)} s, p95 ${(quantile(ms, 0.95) / 1000).toFixed(2)} s, ${plans.filter((p) => p.status !== 200).length} not 200 (target p95 ≤ 0.5 s)`);
	console.log(`  GET of the drawing beside them: ${gets.length} requests, p50 ${quantile(gets, 0.5).toFixed(0)} ms, p95 ${quantile(gets, 0.95).toFixed(0)} ms, longest ${Math.max(...gets).toFixed(0)} ms (target p95 < 100 ms)`);
	server.close();
	await closePlanning();
}

if (import.meta.url === `file://${process.argv[1]}`) await run();
