import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { demoHarness } from '../../src/lib/circuit/demo';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { signIn } from './editor-helpers';

// The seeded demo vehicle's "Complete harness" is demoHarness() (scripts/seed.ts); its demo
// hunt has a planted fault (src/lib/diagnosis/demo.ts). The readings typed here are the ones the
// predict API gives for that fault, rounded as a 3½-digit meter shows them.
const demo = demoHarness();
const partLabelled = (label: string) => demo.parts.find((p) => p.label === label)!;

async function predicted(request: APIRequestContext, diagramId: string, probe: string): Promise<string> {
	const r = await request.post(`/api/diagrams/${diagramId}/predict`, { data: { planProbes: [probe], fault: OPEN_HUNT.plantedFault } });
	expect(r.status(), await r.text()).toBe(200);
	return (Math.round((await r.json()).readings[0].reading * 100) / 100).toFixed(2);
}

async function demoDiagramId(request: APIRequestContext): Promise<{ id: string; revision: number }> {
	const list = await request.get('/api/diagrams');
	const d = ((await list.json()).diagrams as { id: string; title: string; revision: number }[]).find((x) => x.title === 'Complete harness')!;
	return { id: d.id, revision: d.revision };
}

/** Types a reading for the probe on the card and waits until the plan has moved on from it. */
async function enter(page: Page, value: string) {
	const card = page.getByTestId('probe-card');
	const before = await card.getAttribute('data-probe');
	await card.getByTestId('reading-input').fill(value);
	await card.getByTestId('save-reading').click();
	await expect(page.locator(`[data-testid="logged-reading"][data-probe="${before}"]`)).toHaveCount(1);
	await expect(page.locator(`[data-testid="probe-card"][data-probe="${before}"]`)).toHaveCount(0, { timeout: 20_000 });
}

test('the demo fault: shared point, a diagnosis planned and followed to the planted fault, concluded, on the timeline', async ({ page }) => {
	test.setTimeout(180_000);
	await signIn(page);
	await page.goto('/garage');
	await page.getByRole('link', { name: /The Ostrimmel/ }).first().click();
	await expect(page.getByRole('heading', { name: 'The Ostrimmel' })).toBeVisible();
	await page.getByRole('link', { name: /Complete harness/ }).click();
	await page.getByRole('link', { name: 'Open the drawing board' }).click();
	await expect(page.getByTestId('drawing-board')).toBeVisible();
	const diagramId = page.url().split('/diagrams/')[1].split('/')[0];

	// Trace, select the two gauges: their shared point is the stabilizer's output.
	await page.locator('[data-mode="trace"]').click();
	const fuel = partLabelled('Fuel gauge');
	const temp = partLabelled('Coolant temperature gauge');
	const stabilizer = partLabelled('Instrument voltage stabilizer');
	await page.locator(`[data-part-id="${fuel.id}"] .caption`).click();
	await page.locator(`[data-part-id="${temp.id}"] .caption`).click({ modifiers: ['Control'] });
	await expect(page.locator(`[data-part-id="${stabilizer.id}"] [data-role="shared-marker"][data-shared~="feed"]`)).toBeVisible();
	await page.screenshot({ path: '.data/test/diagnosis-shared-point.png' });

	// Both read low (the default mark), then start.
	const start = page.getByTestId('start-diagnosis');
	await expect(start.getByTestId('mark-select')).toHaveCount(2);
	await start.getByTestId('start-diagnosis-button').click();
	await page.waitForURL(/\/diagnoses\/[0-9a-f-]{36}$/, { timeout: 30_000 });
	await expect(page.getByTestId('probe-card')).toBeVisible();
	const suspectsAtStart = await page.getByTestId('suspect').count();
	expect(suspectsAtStart).toBeGreaterThan(3);
	// Both gauges low: what they share is suspected (the stabilizer among it), common practice.
	await expect(page.locator('[data-testid="suspect"][data-suspect="stabilizer:low:stabilizer"]')).toHaveCount(1);
	// Every suspect reads differently (several earths meet at one stud), and a long group of
	// suspects on the card ends in words: "…; …; … and 6 more (53 %)", spaced as a sentence.
	const names = await page.getByTestId('suspect').allTextContents();
	expect(new Set(names).size).toBe(names.length);
	const groups = await page.getByTestId('expected-group').allInnerTexts();
	expect(groups.some((g) => / and \d+ more \(/.test(g))).toBe(true);
	for (const g of groups) expect(g).not.toMatch(/\Sand \d+ more/);

	// Follow the plan, typing what the meter would show with the planted fault there.
	let probes = 0;
	while ((await page.getByTestId('found').count()) === 0 && probes < 8) {
		const probe = (await page.getByTestId('probe-card').getAttribute('data-probe'))!;
		await enter(page, await predicted(page.request, diagramId, probe));
		probes++;
	}
	await expect(page.getByTestId('found')).toHaveAttribute('data-suspect', OPEN_HUNT.plantedSuspect);
	await expect(page.getByTestId('found')).toContainText('wire W (white) at terminal in of 6 (Fuse, ignition accessories)');
	expect(probes).toBeLessThan(suspectsAtStart);
	await expect(page.getByTestId('connection')).toHaveAttribute('data-queued', '0');
	await page.screenshot({ path: '.data/test/diagnosis-found.png', fullPage: true });

	// Conclude: the found suspect is chosen already.
	const form = page.getByTestId('conclude-form');
	await expect(form.getByLabel('What was it?')).toHaveValue(OPEN_HUNT.plantedSuspect);
	await form.getByLabel('What you found and did').fill('Fuse 6 feed clip corroded; cleaned and tensioned. Both gauges read true again.');
	await form.getByLabel(/Parts replaced/).fill('Fuse 6 holder clip');
	await form.getByTestId('conclude').click();
	await expect(page.getByTestId('conclusion')).toContainText('Found:');
	const diagnosisUrl = page.url();

	// The vehicle's timeline shows it, concluded, newest first.
	await page.getByRole('link', { name: 'The Ostrimmel' }).click();
	const entry = page.getByTestId('timeline-entry').first();
	await expect(entry).toHaveAttribute('data-status', 'concluded');
	await expect(entry).toContainText('Fuse 6 holder clip');
	await expect(entry).toContainText('wire W (white) at terminal in of 6 (Fuse, ignition accessories)');
	expect(await entry.locator('a').getAttribute('href')).toBe(new URL(diagnosisUrl).pathname);
	await page.screenshot({ path: '.data/test/diagnosis-timeline.png', fullPage: true });
});

test('offline: two readings typed with no network are kept, and stored once when it is back', async ({ page, context }) => {
	test.setTimeout(120_000);
	await signIn(page);
	const diagram = await demoDiagramId(page.request);
	const started = await page.request.post(`/api/diagrams/${diagram.id}/diagnoses`, { data: { revision: diagram.revision, marks: OPEN_HUNT.marks, title: 'Offline hunt' } });
	expect(started.status(), await started.text()).toBe(201);
	const { diagnosis, plan } = await started.json();
	// The first two planned probes and what the planted fault makes them read (the stateless
	// probe-plan API plans the second step from the first reading, as the page will).
	const first = plan.plan.steps[0].probe as string;
	const firstValue = await predicted(page.request, diagram.id, first);
	const after = await page.request.post(`/api/diagrams/${diagram.id}/probe-plan`, { data: { marks: OPEN_HUNT.marks, readings: { [first]: Number(firstValue) } } });
	const second = (await after.json()).plan.steps[0].probe as string;
	const secondValue = await predicted(page.request, diagram.id, second);

	await page.goto(`/diagnoses/${diagnosis.id}`);
	await expect(page.getByTestId('probe-card')).toHaveAttribute('data-probe', first);
	// Wait for the service worker to keep the page for offline use.
	await page.waitForFunction(async (path) => !!(await navigator.serviceWorker?.ready) && !!(await caches.match(path)), `/diagnoses/${diagnosis.id}`, { timeout: 30_000 });
	const suspectsOnline = await page.getByTestId('suspect').count();

	await context.setOffline(true);
	await expect(page.getByTestId('connection')).toHaveAttribute('data-online', 'no');
	await page.getByTestId('reading-input').fill(firstValue);
	await page.getByTestId('save-reading').click();
	// The plan narrows here, with no network: the next probe is the second planned one.
	await expect(page.getByTestId('probe-card')).toHaveAttribute('data-probe', second, { timeout: 20_000 });
	await page.getByTestId('reading-input').fill(secondValue);
	await page.getByTestId('save-reading').click();
	await expect(page.locator('[data-testid="logged-reading"][data-queued="yes"]')).toHaveCount(2);
	await expect(page.getByTestId('connection')).toHaveAttribute('data-queued', '2');
	expect(await page.getByTestId('suspect').count()).toBeLessThan(suspectsOnline);

	// Still offline, the page reloads from the service worker's cache with the queue intact.
	await page.reload();
	await expect(page.getByTestId('probe-card')).toBeVisible();
	await expect(page.locator('[data-testid="logged-reading"][data-queued="yes"]')).toHaveCount(2);

	await context.setOffline(false);
	await expect(page.getByTestId('connection')).toHaveAttribute('data-queued', '0', { timeout: 30_000 });
	await expect(page.locator('[data-testid="logged-reading"][data-queued="no"]')).toHaveCount(2);
	const stored = await (await page.request.get(`/api/diagnoses/${diagnosis.id}/readings`)).json();
	expect(stored.readings.map((r: { probeId: string }) => r.probeId).sort()).toEqual([first, second].sort());
	// A reload sends nothing again: still exactly two.
	await page.reload();
	await expect(page.locator('[data-testid="logged-reading"]')).toHaveCount(2);
	expect((await (await page.request.get(`/api/diagnoses/${diagnosis.id}/readings`)).json()).readings).toHaveLength(2);
});
