import { expect, test } from '@playwright/test';
import { documentOf, newDiagram, panelLampLoom, signIn, waitSaved } from './editor-helpers';

// Colour names: the trade-letter palette (src/lib/circuit/palettes.ts: G green, B black) and
// IEC 60757 (GN green, BK black). The loom is the invented panel-lamp loom of editor-helpers.ts.
type SavedWire = { id: string; code: string; from: { part: string; terminal: string }; to: { part: string; terminal: string } };
type SavedPart = { id: string; kind: string; key: string; label: string };

test('copy parts in one tab and paste them into another diagram in another tab', async ({ browser }) => {
	const context = await browser.newContext({ permissions: ['clipboard-read', 'clipboard-write'] });
	const a = await context.newPage();
	await signIn(a);
	const source = await newDiagram(a.request, 'Clipboard source loom', panelLampLoom('negative'));
	const target = await newDiagram(a.request, 'Clipboard target loom', { schemaVersion: 1, vehicle: { systemVoltage: 12, earth: 'negative' }, palette: 'iec-60757', parts: [], wires: [] });

	await a.goto(`/diagrams/${source}/draw`);
	await expect(a.locator('[data-part-id]')).toHaveCount(3);
	// The lamp and the earth point: the B wire runs between them, the G/B wire leaves to the switch.
	await a.locator('[data-part-id="lamp"] .caption').click();
	await a.locator('[data-part-id="earth"] .caption').click({ modifiers: ['Shift'] });
	await expect(a.getByRole('heading', { name: '2 parts and 0 wires selected' })).toBeVisible();
	await a.keyboard.press('Control+c');
	// On the system clipboard as Loomwright's JSON.
	const copied = JSON.parse(await a.evaluate(() => navigator.clipboard.readText()));
	expect(copied.loomwright).toBe('loomwright/parts');
	expect(copied.parts.map((p: SavedPart) => p.key)).toEqual(['12', '3']);

	const b = await context.newPage();
	await b.goto(`/diagrams/${target}/draw`);
	await expect(b.getByTestId('drawing-board')).toBeVisible();
	await b.keyboard.press('Control+v');
	await expect(b.locator('[data-part-id]')).toHaveCount(2);
	await expect(b.locator('[data-wire-id]')).toHaveCount(1);
	// The copied wire's code B (black) is written in this diagram's IEC palette: BK.
	await expect(b.locator('[data-wire-id]')).toHaveAttribute('data-code', 'BK');
	await b.screenshot({ path: `${process.env.LOOM_TEST_OUT ?? '.data/test'}/editor-paste-other-tab.png` });
	await waitSaved(b);
	const doc = (await documentOf(b.request, target)).document as unknown as { parts: (SavedPart & { id: string })[]; wires: SavedWire[] };
	expect(doc.parts.map((p) => [p.kind, p.key, p.label])).toEqual([
		['lamp', '12', 'Panel lamp'],
		['earth-point', '3', 'Dash earth']
	]);
	// Fresh ids, and the wire joins the pasted parts.
	expect(doc.parts.map((p) => p.id)).not.toContain('lamp');
	expect(doc.wires[0]).toMatchObject({ code: 'BK', from: { part: doc.parts[0].id, terminal: 'earth' }, to: { part: doc.parts[1].id, terminal: 'stud' } });

	// Other text on the clipboard is left alone: nothing more is pasted.
	await b.evaluate(() => navigator.clipboard.writeText('G/B 1.0 mm² 0.8 m'));
	await b.locator('.svelte-flow__pane').click({ position: { x: 20, y: 20 } });
	await b.keyboard.press('Control+v');
	await b.waitForTimeout(300);
	await expect(b.locator('[data-part-id]')).toHaveCount(2);

	// Copied again (the clipboard now holds that text) and pasted into its own diagram: the copy
	// lands offset, with the next free key numbers.
	await a.bringToFront();
	await a.keyboard.press('Control+c');
	await a.keyboard.press('Control+v');
	await expect(a.locator('[data-part-id]')).toHaveCount(5);
	await expect(a.locator('[data-part-id][data-key="13"]')).toHaveAttribute('data-kind', 'lamp');
	await expect(a.locator('[data-part-id][data-key="14"]')).toHaveAttribute('data-kind', 'earth-point');
	await context.close();
});

test('a paste without clipboard access still finds the last copy made in this browser', async ({ browser }) => {
	// No clipboard permissions: the copy is kept in localStorage, which every tab of the site shares.
	const context = await browser.newContext();
	const a = await context.newPage();
	await signIn(a);
	const source = await newDiagram(a.request, 'Stored clip source', panelLampLoom('positive'));
	const target = await newDiagram(a.request, 'Stored clip target');
	await a.goto(`/diagrams/${source}/draw`);
	await a.locator('[data-part-id="sw"] .caption').click();
	await a.keyboard.press('Control+a');
	await a.keyboard.press('Control+c');
	const stored = await a.evaluate(() => localStorage.getItem('loomwright.clipboard'));
	expect(JSON.parse(stored!).parts).toHaveLength(3);

	const b = await context.newPage();
	await b.goto(`/diagrams/${target}/draw`);
	await expect(b.getByTestId('drawing-board')).toBeVisible();
	// The browser's paste event carries nothing without access; the stored copy is used.
	await b.evaluate(() => window.dispatchEvent(new KeyboardEvent('keydown', { key: 'v', ctrlKey: true, bubbles: true })));
	await expect(b.locator('[data-part-id]')).toHaveCount(3);
	await expect(b.locator('[data-wire-id]')).toHaveCount(2);
	await expect(b.locator('[data-wire-id]').first()).toHaveAttribute('data-code', 'G/B');
	await context.close();
});

test('copy, duplicate and paste with the buttons, on a touch screen without a keyboard', async ({ browser }) => {
	const context = await browser.newContext({ hasTouch: true });
	const page = await context.newPage();
	await signIn(page);
	const id = await newDiagram(page.request, 'Button copy loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.locator('[data-part-id]')).toHaveCount(3);
	await page.locator('[data-part-id="lamp"] .caption').tap();
	await expect(page.getByRole('heading', { name: 'Lamp 12' })).toBeVisible();
	// Duplicate: a new lamp with the next free key (the loom's highest key is 12).
	await page.getByRole('button', { name: 'Duplicate' }).tap();
	await expect(page.locator('[data-part-id][data-key="13"]')).toHaveAttribute('data-kind', 'lamp');
	// Nothing selected: the drawing's panel offers the kept copy.
	await page.locator('.svelte-flow__pane').tap({ position: { x: 30, y: 400 } });
	await page.getByRole('button', { name: 'Paste 1 copied part' }).tap();
	await expect(page.locator('[data-part-id][data-key="14"]')).toHaveAttribute('data-kind', 'lamp');
	await waitSaved(page);
	const doc = (await documentOf(page.request, id)).document as unknown as { parts: SavedPart[] };
	expect(doc.parts.map((p) => [p.kind, p.key, p.label])).toEqual([
		['switch', '7', 'Panel switch'],
		['lamp', '12', 'Panel lamp'],
		['earth-point', '3', 'Dash earth'],
		['lamp', '13', 'Panel lamp'],
		['lamp', '14', 'Panel lamp']
	]);
	await context.close();
});
