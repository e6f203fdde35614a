// Import and export on the drawing board: the demo vehicle's CSV imported as one undoable step
// and laid out, the drawing exported as SVG, a bad CSV's problems listed before anything
// changes, and a manual page traced under the canvas that another account cannot fetch.
import { readFileSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { demoHarness } from '../../src/lib/circuit/demo';
import { documentOf, newDiagram, signIn, waitSaved } from './editor-helpers';

const fixture = (name: string) => new URL(`../../fixtures/${name}`, import.meta.url).pathname;
const demo = demoHarness();

test('import the demo CSV, lay it out, undo it as one step, export the drawing as SVG', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'CSV import loom');
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.getByTestId('drawing-board')).toBeVisible();

	await page.getByRole('button', { name: 'Import…' }).click();
	await page.getByTestId('import-file').setInputFiles(fixture('demo-harness.csv'));
	await expect(page.getByTestId('import-summary')).toContainText(`Would add ${demo.wires.length} wires`);
	await expect(page.getByTestId('import-errors')).toHaveCount(0);
	// Every part is new to this empty diagram: listed by key number, and created only when asked.
	await expect(page.getByTestId('import-new-parts')).toContainText(`${demo.parts.length} key numbers not in this diagram: ${demo.parts.map((p) => p.key).join(', ')}`);
	await expect(page.getByTestId('import-confirm')).toBeDisabled();
	await page.getByTestId('import-add-parts').check();
	const rows = demo.parts.length + demo.wires.length;
	await page.getByTestId('import-confirm').click();
	await expect(page.getByTestId('import-dialog')).not.toBeVisible();
	await expect(page.locator('.svelte-flow__node')).toHaveCount(demo.parts.length, { timeout: 30_000 });
	await waitSaved(page);

	const saved = await documentOf(page.request, id);
	expect(saved.document.parts.map((p) => p.key).sort()).toEqual(demo.parts.map((p) => p.key).sort());
	expect(saved.document.wires).toHaveLength(demo.wires.length);
	// Laid out by ELK: no two parts left on one spot (the import alone stacks new parts in a grid).
	const spots = new Set((saved.document.parts as unknown as { position: { x: number; y: number } }[]).map((p) => `${p.position.x},${p.position.y}`));
	expect(spots.size).toBe(demo.parts.length);

	// One undo takes the whole import back.
	await expect(page.getByRole('button', { name: `Undo: Import ${rows} rows from demo-harness.csv` })).toBeVisible();
	await page.getByRole('button', { name: /^Undo/ }).click();
	await expect(page.locator('.svelte-flow__node')).toHaveCount(0);
	await page.getByRole('button', { name: /^Redo/ }).click();
	await expect(page.locator('.svelte-flow__node')).toHaveCount(demo.parts.length);

	// Tidy again on demand: undoable too.
	await page.getByTestId('tidy').click();
	await expect(page.getByRole('button', { name: 'Undo: Tidy the drawing' })).toBeVisible({ timeout: 30_000 });
	await page.screenshot({ path: '.data/test/e2e-results/harness-io-imported.png' });

	await page.getByText('Export ▾').click();
	const [svgFile] = await Promise.all([page.waitForEvent('download'), page.getByRole('menuitem', { name: 'Drawing as SVG' }).click()]);
	expect(svgFile.suggestedFilename()).toBe('csv-import-loom.svg');
	const svg = readFileSync(await svgFile.path(), 'utf8');
	expect(svg).toMatch(/^<\?xml version="1.0" encoding="UTF-8"\?>\n<svg xmlns="http:\/\/www.w3.org\/2000\/svg"/);
	expect(svg.match(/<g class="part"/g)).toHaveLength(demo.parts.length);
	expect(svg.match(/<g class="wire"/g)).toHaveLength(demo.wires.length);

	await page.getByText('Export ▾').click();
	const [pngFile] = await Promise.all([page.waitForEvent('download'), page.getByRole('menuitem', { name: 'Drawing as PNG' }).click()]);
	const png = readFileSync(await pngFile.path());
	// PNG signature (ISO/IEC 15948 §5.2).
	expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
});

test('a CSV with planted errors lists them by row and column and imports only the valid rows', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Bad CSV loom');
	await page.goto(`/diagrams/${id}/draw`);
	await page.getByRole('button', { name: 'Import…' }).click();
	await page.getByTestId('import-file').setInputFiles(fixture('bad-wire-list.csv'));
	const table = page.getByTestId('import-errors');
	await expect(table).toBeVisible();
	// fixtures/bad-wire-list.md: eleven planted errors.
	await expect(table.locator('tbody tr')).toHaveCount(11);
	await expect(table.locator('tr[data-row="16"][data-column="colour"]')).toContainText('RX');
	await expect(table.locator('tr[data-row="17"][data-column="from terminal"]')).toContainText('one of in, out');
	await page.screenshot({ path: '.data/test/e2e-results/harness-io-errors.png' });
	// Nothing has changed yet.
	expect((await documentOf(page.request, id)).revision).toBe(1);
	await page.getByTestId('import-add-parts').check();
	await page.getByRole('button', { name: 'Import the 9 valid rows' }).click();
	await expect(page.locator('.svelte-flow__node')).toHaveCount(5, { timeout: 30_000 });
	await waitSaved(page);
	expect((await documentOf(page.request, id)).document.parts.map((p) => p.kind)).toEqual(['battery', 'earth-point', 'fuse', 'switch', 'lamp']);
});

test('a manual page is traced under the canvas at the chosen opacity; another account cannot fetch it', async ({ page, browser }) => {
	// Upload, reload and a second sign-up (argon2id) on a busy two-core machine.
	test.setTimeout(120_000);
	await signIn(page);
	const id = await newDiagram(page.request, 'Traced loom', demo);
	await page.goto(`/diagrams/${id}/draw`);
	await page.getByRole('button', { name: /^Manual pages/ }).click();
	await page.getByTestId('page-file').setInputFiles(fixture('manual-page.png'));
	const image = page.getByTestId('tracing-image');
	await expect(image).toBeVisible();
	await expect(image).toHaveJSProperty('complete', true);
	expect(await image.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(1000);

	await page.getByTestId('page-opacity').fill('0.3');
	await expect(image).toHaveCSS('opacity', '0.3');
	// Under the drawing: in the canvas's back layer, and a part drawn over it takes the pointer.
	expect(await image.evaluate((img) => !!img.closest('.svelte-flow__viewport-back'))).toBe(true);
	await page.getByTestId('page-lock').check();
	// The right-most part on screen (the pages panel covers the left).
	const boxes = await Promise.all((await page.locator('.svelte-flow__node').all()).map((n) => n.boundingBox()));
	const box = boxes.filter((b) => b !== null).sort((a, b) => b.x - a.x)[0];
	const onTop = await page.evaluate(({ x, y }) => document.elementFromPoint(x, y)?.closest('.svelte-flow__node') !== null, { x: box.x + box.width / 2, y: box.y + box.height / 2 });
	expect(onTop).toBe(true);
	await page.screenshot({ path: '.data/test/e2e-results/harness-io-tracing.png' });

	// The setting is kept: after a reload the page comes back at 30 %.
	await page.waitForTimeout(800);
	await page.reload();
	await page.getByRole('button', { name: /^Manual pages/ }).click();
	await expect(page.getByTestId('tracing-image')).toHaveCSS('opacity', '0.3');

	const src = await page.getByTestId('tracing-image').getAttribute('src');
	expect(src).toMatch(new RegExp(`^/api/diagrams/${id}/pages/[0-9a-f-]{36}$`));
	expect((await page.request.get(src!)).status()).toBe(200);

	const other = await browser.newContext();
	const stranger = await other.newPage();
	await stranger.goto('/signup');
	await stranger.getByLabel('Your name').fill('Page Onlooker');
	await stranger.getByLabel('E-mail address').fill(`onlooker-${Date.now()}@example.test`);
	await stranger.getByLabel('Password', { exact: true }).fill('bobbin-cutout-contacts-9');
	await stranger.getByRole('button', { name: 'Create account' }).click();
	await expect(stranger).toHaveURL(/\/garage$/);
	expect((await stranger.request.get(src!)).status()).toBe(404);
	const anonymous = await browser.newContext();
	expect((await anonymous.request.get(src!)).status()).toBe(401);
	await other.close();
	await anonymous.close();
});

test('export the document file, import it as a new diagram: the documents are equal', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Round trip loom', demo);
	await page.goto(`/diagrams/${id}/draw`);
	await page.getByText('Export ▾').click();
	const [file] = await Promise.all([page.waitForEvent('download'), page.getByRole('menuitem', { name: 'Document file (JSON)' }).click()]);
	expect(file.suggestedFilename()).toBe('round-trip-loom.loom.json');
	const path = await file.path();

	await page.getByRole('button', { name: 'Import…' }).click();
	await page.getByTestId('import-file').setInputFiles({ name: 'round-trip-loom.loom.json', mimeType: 'application/json', buffer: readFileSync(path) });
	await page.getByTestId('import-open-new').click();
	await page.waitForURL((url) => /\/diagrams\/[0-9a-f-]{36}\/draw$/.test(url.pathname) && !url.pathname.includes(id));
	await expect(page.locator('.svelte-flow__node')).toHaveCount(demo.parts.length);
	const copyId = new URL(page.url()).pathname.split('/')[2];
	expect((await documentOf(page.request, copyId)).document).toEqual((await documentOf(page.request, id)).document);

	// A broken file names the JSON path of each problem and opens nothing.
	const broken = JSON.parse(readFileSync(path, 'utf8'));
	broken.wires[0].to.terminal = 'nowhere';
	await page.getByRole('button', { name: 'Import…' }).click();
	await page.getByTestId('import-file').setInputFiles({ name: 'broken.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(broken)) });
	await expect(page.getByTestId('document-errors')).toContainText('wires[0].to.terminal');
	await expect(page.getByTestId('import-open-new')).toHaveCount(0);
});
