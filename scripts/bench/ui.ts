// Drawing board benchmark: opens a generated loom of 1,000 parts and 2,000 wires in chromium
// and prints how long it takes to draw, and the median frame time while panning and zooming.
// Targets: opens in under 3 s; median frame ≤ 20 ms while panning.
//
//   npx tsx scripts/bench/ui.ts
//
// Starts its own server from build/ (or LOOM_BUILD_DIR; run `npm run build` first) against E2E_DATABASE_URL,
// after migrating and seeding it; or set BENCH_URL to use a running server with the demo account.
import { chromium, type Page } from '@playwright/test';
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { generateLoom } from './loom';
import { OVERVIEW_ZOOM } from '../../src/lib/editor/overview';

const PARTS = Number(process.env.BENCH_PARTS ?? 1000);
const WIRES = Number(process.env.BENCH_WIRES ?? 2000);
const PORT = Number(process.env.BENCH_PORT ?? 4191);
const DEMO = { email: 'demo@loomwright.test', password: 'tracer-stripe-demo' };

async function waitFor(url: string, ms: number) {
	const end = Date.now() + ms;
	while (Date.now() < end) {
		try {
			if ((await fetch(url)).ok) return;
		} catch {
			/* not up yet */
		}
		await new Promise((r) => setTimeout(r, 250));
	}
	throw new Error(`bench: server at ${url} did not come up`);
}

async function startServer(): Promise<{ origin: string; child: ChildProcess | null }> {
	if (process.env.BENCH_URL) return { origin: process.env.BENCH_URL.replace(/\/$/, ''), child: null };
	const db = process.env.E2E_DATABASE_URL;
	if (!db) throw new Error('bench: set E2E_DATABASE_URL (a migratable database) or BENCH_URL (a running server)');
	const origin = `http://localhost:${PORT}`;
	// The generated loom's JSON is larger than adapter-node's default 512 kB body limit.
	const env = { ...process.env, DATABASE_URL: db, PORT: String(PORT), ORIGIN: origin, NODE_ENV: 'production', BODY_SIZE_LIMIT: '16M', LOOM_DEV_MAIL: '1' };
	execFileSync('node', ['--import', 'tsx', 'scripts/migrate.ts'], { env, stdio: 'ignore' });
	execFileSync('node', ['--import', 'tsx', 'scripts/seed.ts'], { env, stdio: 'ignore' });
	const child = spawn('node', [process.env.LOOM_BUILD_DIR ?? 'build'], { env, stdio: 'ignore' });
	await waitFor(`${origin}/api/health`, 30_000);
	return { origin, child };
}

const median = (xs: number[]) => {
	const s = [...xs].sort((a, b) => a - b);
	return s.length ? s[Math.floor(s.length / 2)] : NaN;
};
const percentile = (xs: number[], p: number) => {
	const s = [...xs].sort((a, b) => a - b);
	return s.length ? s[Math.min(s.length - 1, Math.floor(s.length * p))] : NaN;
};

/** Frame times (ms) recorded with requestAnimationFrame while `act` runs. */
async function frames(page: Page, act: () => Promise<void>): Promise<number[]> {
	// A script string, not a function: the bundler's helpers would not exist in the page.
	await page.evaluate(`(() => {
		window.__frames = [];
		window.__stop = false;
		let last = performance.now();
		function tick(t) {
			window.__frames.push(t - last);
			last = t;
			if (!window.__stop) requestAnimationFrame(tick);
		}
		requestAnimationFrame(tick);
	})()`);
	await act();
	return page.evaluate('(() => { window.__stop = true; return window.__frames.slice(1); })()') as Promise<number[]>;
}

async function main() {
	const { origin, child } = await startServer();
	const browser = await chromium.launch({
		executablePath: '/usr/bin/chromium',
		args: ['--no-sandbox', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run']
	});
	try {
		const context = await browser.newContext({ baseURL: origin, viewport: { width: 1600, height: 1000 } });
		const page = await context.newPage();
		await page.goto('/signin');
		await page.getByLabel('E-mail address').fill(DEMO.email);
		await page.getByLabel('Password').fill(DEMO.password);
		await page.getByRole('button', { name: 'Sign in' }).click();
		await page.waitForURL((u) => !u.pathname.startsWith('/signin'));

		const vehicles = await (await page.request.get('/api/vehicles')).json();
		const document = generateLoom(PARTS, WIRES);
		const created = await page.request.post('/api/diagrams', { data: { vehicleId: vehicles.vehicles[0].id, title: `Bench loom ${PARTS}/${WIRES}`, document } });
		if (created.status() !== 201) throw new Error(`bench: creating the loom failed: ${created.status()} ${(await created.text()).slice(0, 300)}`);
		const id = (await created.json()).diagram.id;
		console.log(`loom: ${PARTS} parts, ${WIRES} wires, ${(JSON.stringify(document).length / 1024).toFixed(0)} kB of JSON`);

		// Load: navigation start until parts and wires are drawn on the canvas.
		const t0 = Date.now();
		await page.goto(`/diagrams/${id}/draw`);
		await page.locator('[data-wire-id]').first().waitFor({ state: 'attached', timeout: 60_000 });
		await page.locator('[data-part-id]').first().waitFor({ state: 'visible' });
		await page.evaluate('new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r)))');
		const load = Date.now() - t0;
		const drawn = (await page.evaluate(
			'({ parts: document.querySelectorAll("[data-part-id]").length, wires: document.querySelectorAll("[data-wire-id]").length, nav: performance.getEntriesByType("navigation")[0].toJSON() })'
		)) as { parts: number; wires: number; nav: { responseEnd: number; domContentLoadedEventEnd: number } };
		console.log(`  server answered at ${drawn.nav.responseEnd.toFixed(0)} ms, page script ready at ${drawn.nav.domContentLoadedEventEnd.toFixed(0)} ms`);
		console.log(`open: ${load} ms to a drawn canvas (target < 3000 ms); on screen: ${drawn.parts} parts, ${drawn.wires} wires`);

		// Pan: drag the empty paper in small steps for a few seconds.
		const pane = await page.locator('.svelte-flow__pane').boundingBox();
		if (!pane) throw new Error('bench: no canvas pane');
		const cx = pane.x + pane.width / 2;
		const cy = pane.y + pane.height / 2;
		// BENCH_PROFILE=1: a CPU profile of the pan, the functions with the most samples printed.
		const cdp = process.env.BENCH_PROFILE ? await context.newCDPSession(page) : null;
		if (cdp) {
			await cdp.send('Profiler.enable');
			await cdp.send('Profiler.start');
		}
		const pan = await frames(page, async () => {
			for (let round = 0; round < 3; round++) {
				await page.mouse.move(cx + 300, cy + 200);
				await page.mouse.down();
				for (let i = 1; i <= 60; i++) await page.mouse.move(cx + 300 - i * 10, cy + 200 - i * 6);
				await page.mouse.up();
			}
		});
		if (cdp) {
			const { profile } = await cdp.send('Profiler.stop');
			const self = new Map<string, number>();
			let total = 0;
			for (const n of profile.nodes) {
				const hits = n.hitCount ?? 0;
				total += hits;
				const f = n.callFrame;
				const key = `${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber + 1}`;
				self.set(key, (self.get(key) ?? 0) + hits);
			}
			console.log('pan profile, self samples:');
			for (const [k, v] of [...self].sort((a, b) => b[1] - a[1]).slice(0, 20)) console.log(`  ${((100 * v) / total).toFixed(1).padStart(5)} %  ${k}`);
		}
		console.log(`pan: median frame ${median(pan).toFixed(1)} ms, 90th percentile ${percentile(pan, 0.9).toFixed(1)} ms over ${pan.length} frames (target median ≤ 20 ms)`);

		const zoom = await frames(page, async () => {
			await page.mouse.move(cx, cy);
			for (let i = 0; i < 20; i++) await page.mouse.wheel(0, i < 10 ? 120 : -120);
			await page.waitForTimeout(300);
		});
		console.log(
			`zoom: median frame ${median(zoom).toFixed(1)} ms, 90th percentile ${percentile(zoom, 0.9).toFixed(1)} ms over ${zoom.length} frames (out to the overview below zoom ${OVERVIEW_ZOOM} and back in, where the parts are mounted again)`
		);
		await context.close();
	} finally {
		await browser.close();
		child?.kill('SIGTERM');
	}
}

await main();
