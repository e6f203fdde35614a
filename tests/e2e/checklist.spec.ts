import { readFile } from 'node:fs/promises';
import { expect, test } from '@playwright/test';
import { pdfText, stepHeadings } from '../../src/lib/diagnosis/testing/pdf-text';
import { signIn } from './editor-helpers';

// Must-show 2 of the diagnosis work: the probe checklist's print page under print media shows
// the cautions and every step with its expected readings, with the screen's controls gone, and
// the PDF download has as many steps as the page. The diagnosis is the demo fault hunt on the
// seeded demo harness (scripts/seed.ts): fuel and temperature gauges both reading low.

/**
 * The ends of a band as the checklist prints it: two decimals and the unit (plan.ts, digits = 2),
 * the minus sign U+2212 below zero (ISO 80000-1), lamp brightness in whole %; "−12.74 to −11.82 V",
 * "0.00–0.03 V", "2.10 Ω to OL", "OL (over range)"; OL is Infinity.
 */
function band(text: string, unit: string): { low: number; high: number } {
	if (text === 'OL (over range)') return { low: Infinity, high: Infinity };
	const num = (t: string) => Number(t.replace('\u2212', '-'));
	const n = `\u2212?${unit === '%' ? '\\d+' : '\\d+\\.\\d\\d'}`;
	const m = new RegExp(`^(${n})(?:(?: to |\u2013)(${n}))? ${unit}$`).exec(text) ?? new RegExp(`^(${n}) ${unit} to (OL)$`).exec(text);
	if (!m) throw new Error(`not a band in ${unit}: "${text}"`);
	return { low: num(m[1]), high: m[2] === 'OL' ? Infinity : num(m[2] ?? m[1]) };
}

test('checklist print page: cautions, every step with its expected readings, controls hidden; the PDF has as many steps', async ({ page }, testInfo) => {
	test.setTimeout(120_000);
	await signIn(page);
	const list = await page.request.get('/api/diagrams');
	expect(list.ok()).toBe(true);
	const harness = ((await list.json()).diagrams as { id: string; title: string }[]).find((d) => d.title === 'Complete harness');
	expect(harness, 'the seeded demo diagram').toBeTruthy();
	const diagram = (await (await page.request.get(`/api/diagrams/${harness!.id}`)).json()).diagram as { revision: number };
	const started = await page.request.post(`/api/diagrams/${harness!.id}/diagnoses`, {
		data: { revision: diagram.revision, marks: [{ part: 'fuel-gauge', mark: 'reads-low' }, { part: 'temp-gauge', mark: 'reads-low' }] }
	});
	expect(started.status(), await started.text()).toBe(201);
	const { diagnosis, plan } = (await started.json()) as { diagnosis: { id: string }; plan: { plan: { steps: { step: number; probe: string }[] }; probes: { id: string; unit: string }[] } };
	const steps = plan.plan.steps;
	expect(steps.length).toBeGreaterThan(3);
	// The diagnosis's page data names each step's probe; the stateless plan of the same marks gives
	// what each suspect reads there (the same plan: same document, scenario and meter).
	const stateless = await page.request.post(`/api/diagrams/${harness!.id}/probe-plan`, { data: { marks: [{ part: 'fuel-gauge', mark: 'reads-low' }, { part: 'temp-gauge', mark: 'reads-low' }] } });
	const predicted = (await stateless.json()).plan.steps as { step: number; probe: string; expected: { suspect: string; reading: number | null }[] }[];
	expect(predicted.map((s) => s.probe)).toEqual(steps.map((s) => s.probe));

	await page.emulateMedia({ media: 'print' });
	await page.goto(`/diagnoses/${diagnosis.id}/checklist`);

	// The cautions block, with the ones the demo needs: battery always, the breaker-point coil
	// (the demo has an ignition coil and powered steps), and the general note.
	const cautions = page.locator('[data-cautions]');
	await expect(cautions).toBeVisible();
	await expect(cautions).toContainText('Cautions: read before you start');
	await expect(cautions.locator('[data-caution="battery"]')).toContainText('hydrogen');
	await expect(cautions.locator('[data-caution="coil"]')).toContainText('disconnect the coil feed');
	await expect(cautions.locator('[data-caution="general"]')).toContainText('qualified technician');

	// Screen-only controls and the site's header and footer are not on paper.
	await expect(page.locator('[data-screen-only]')).toBeHidden();
	await expect(page.getByRole('button', { name: 'Print' })).toBeHidden();
	await expect(page.getByRole('link', { name: 'Download PDF' })).toBeHidden();
	await expect(page.locator('header:has(~ #main)')).toBeHidden();
	await expect(page.locator('#main ~ footer')).toBeHidden();

	// Every step, in order, each with every expected reading of the plan as a band that holds it;
	// step 1 reads the battery, with when to charge it.
	const stepItems = page.locator('[data-step]');
	await expect(stepItems).toHaveCount(steps.length);
	await expect(page.locator('[data-step="1"] [data-advice]')).toContainText('Read the battery first');
	for (const s of predicted) {
		const item = page.locator(`[data-step="${s.step}"]`);
		await expect(item).toBeVisible();
		await expect(item).toContainText(`Step ${s.step}`);
		await expect(item.locator('[data-expected]')).toHaveCount(s.expected.length);
		const unit = plan.probes.find((p) => p.id === s.probe)!.unit;
		for (const e of s.expected) {
			if (e.reading === null) continue;
			const b = band((await item.locator(`[data-expected="${e.suspect}"] td`).first().textContent())!.trim(), unit);
			const half = unit === '%' ? 0.5 : 0.005;
			if (Number.isFinite(b.high)) expect(e.reading, `${s.probe} ${e.suspect}`).toBeGreaterThanOrEqual(b.low - half);
			if (Number.isFinite(b.high)) expect(e.reading, `${s.probe} ${e.suspect}`).toBeLessThanOrEqual(b.high + half);
		}
		await expect(item.locator('.reading-box')).toBeVisible();
	}

	// Looked at by eye: the page as print media shows it, and as Chromium prints it (A4 from @page).
	await page.screenshot({ path: testInfo.outputPath('checklist-print.png'), fullPage: true });
	await page.pdf({ path: testInfo.outputPath('checklist-printed.pdf'), preferCSSPageSize: true, printBackground: true });

	// On screen: choose Letter, and download the PDF. Nothing on the page asks the network for
	// anything once it has loaded (so it keeps working from the cache offline).
	const asked: string[] = [];
	page.on('request', (r) => asked.push(r.url()));
	await page.emulateMedia({ media: 'screen' });
	await expect(page.getByRole('button', { name: 'Print' })).toBeVisible();
	await page.getByText('Letter', { exact: true }).click();
	await expect(page.getByRole('link', { name: 'Download PDF' })).toHaveAttribute('href', `/api/diagnoses/${diagnosis.id}/checklist.pdf?paper=letter`);
	expect(await page.evaluate(() => [...document.head.querySelectorAll('style')].some((s) => s.textContent?.includes('size:letter')))).toBe(true);
	await page.getByText('A4', { exact: true }).click();
	await page.screenshot({ path: testInfo.outputPath('checklist-screen.png') });
	expect(asked).toEqual([]);

	const downloading = page.waitForEvent('download');
	await page.getByRole('link', { name: 'Download PDF' }).click();
	const download = await downloading;
	expect(download.suggestedFilename()).toMatch(/^checklist-the-ostrimmel-\d{4}-\d\d-\d\d-[0-9a-f]{8}\.pdf$/);
	const bytes = new Uint8Array(await readFile((await download.path())!));
	// ISO 32000-1 §7.5.2: "%PDF-" first.
	expect(new TextDecoder().decode(bytes.slice(0, 5))).toBe('%PDF-');
	const text = await pdfText(bytes);
	expect(stepHeadings(text)).toEqual(steps.map((s) => s.step));
	expect(stepHeadings(text)).toHaveLength(await stepItems.count());
	expect(text.runs.flat()).toContain('CAUTIONS: read before you start');
});
