import { expect, test } from '@playwright/test';
import { centreOf, documentOf, drag, newDiagram, signIn, waitSaved } from './editor-helpers';

// Expected screen colours are the display colours the trade-letter palette declares
// (src/lib/circuit/palettes.ts): G green #2e7d32, B black #1a1a1a. A new wire takes the
// palette's first colour, B.
const GREEN = '#2e7d32';
const BLACK = '#1a1a1a';

test('draw two parts, wire them, code the wire, undo, redo and find it saved', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Sidelamp test loom');
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.getByTestId('drawing-board')).toBeVisible();

	// Add parts from the tray: each lands in a free spot, selected.
	await page.locator('[data-add-kind="fuse"]').click();
	await page.locator('[data-add-kind="lamp"]').click();
	const fuse = page.locator('[data-kind="fuse"]');
	const lamp = page.locator('[data-kind="lamp"]');
	await expect(fuse).toHaveCount(1);
	await expect(lamp).toHaveCount(1);
	await expect(fuse).toHaveAttribute('data-key', '1');
	await expect(lamp).toHaveAttribute('data-key', '2');

	// Drag from the fuse's out terminal to the lamp's feed terminal.
	await drag(page, await centreOf(page, '[data-kind="fuse"] [data-terminal="out"]'), await centreOf(page, '[data-kind="lamp"] [data-terminal="feed"]'));
	const wire = page.locator('[data-wire-id]');
	await expect(wire).toHaveCount(1);
	await expect(wire.locator('[data-role="base"]')).toHaveAttribute('stroke', BLACK);

	// The new wire is selected: give it the code G/B in the properties panel.
	const code = page.getByRole('combobox', { name: 'Colour code' });
	await code.fill('G/B');
	await code.press('Enter');
	await expect(wire).toHaveAttribute('data-code', 'G/B');
	await expect(wire.locator('[data-role="base"]')).toHaveAttribute('stroke', GREEN);
	await expect(wire.locator('[data-role="tracer"]')).toHaveAttribute('stroke', BLACK);
	// The rendered stroke, not only the attribute: base wider than the tracer.
	const drawn = await wire.evaluate((g) => {
		const style = (sel: string) => getComputedStyle(g.querySelector(sel)!);
		return { base: style('[data-role="base"]').stroke, tracer: style('[data-role="tracer"]').stroke, baseWidth: style('[data-role="base"]').strokeWidth, tracerWidth: style('[data-role="tracer"]').strokeWidth };
	});
	expect(drawn).toEqual({ base: 'rgb(46, 125, 50)', tracer: 'rgb(26, 26, 26)', baseWidth: '6px', tracerWidth: '2px' });
	// The code is also written in text beside the wire.
	await expect(wire.locator('.code-label text')).toHaveText('G/B');

	// A code the palette does not know is refused, in the panel and on the canvas; typing the
	// wire's own code again puts it right, and both messages go.
	await code.fill('XQ');
	await code.press('Enter');
	const refusal = page.locator('#prop-code-error');
	await expect(refusal).toContainText('unknown colour code "XQ"');
	await expect(page.getByRole('alert').filter({ hasText: 'unknown colour code' })).toHaveCount(1);
	await code.fill('G/B');
	await code.press('Enter');
	await expect(refusal).toHaveCount(0);
	await expect(page.getByRole('alert').filter({ hasText: 'unknown colour code' })).toHaveCount(0);
	await expect(wire).toHaveAttribute('data-code', 'G/B');

	// BK in this single-letter palette is black with a pink tracer; IEC 60757 reads it as black.
	// The panel says how it was read and offers the other reading, written B here.
	await code.fill('BK');
	await code.press('Enter');
	await expect(wire).toHaveAttribute('data-code', 'B/K');
	const offer = page.getByTestId('code-other-reading');
	await expect(offer).toContainText('BK was read as black with pink tracer (B/K)');
	await expect(offer).toContainText('In IEC 60757 two-letter codes, BK is black.');
	await offer.getByRole('button', { name: 'Use B (black)' }).click();
	await expect(wire).toHaveAttribute('data-code', 'B');
	await expect(offer).toHaveCount(0);
	await code.fill('G/B');
	await code.press('Enter');
	await expect(wire).toHaveAttribute('data-code', 'G/B');
	await page.locator('[data-part-id]').first().scrollIntoViewIfNeeded();
	await page.screenshot({ path: '.data/test/editor-stripe.png' });

	// Undo takes the code back to black; redo brings green with black tracer again.
	await page.getByRole('button', { name: /^Undo/ }).click();
	await expect(wire.locator('[data-role="base"]')).toHaveAttribute('stroke', BLACK);
	await expect(wire.locator('[data-role="tracer"]')).toHaveCount(0);
	await page.getByRole('button', { name: /^Redo/ }).click();
	await expect(wire.locator('[data-role="tracer"]')).toHaveAttribute('stroke', BLACK);
	await expect(wire.locator('[data-role="base"]')).toHaveAttribute('stroke', GREEN);

	// Autosave, then reload: the parts and the coded wire come back from the server.
	await waitSaved(page);
	const saved = await documentOf(page.request, id);
	expect(saved.document.parts.map((p) => [p.kind, p.key])).toEqual([
		['fuse', '1'],
		['lamp', '2']
	]);
	expect(saved.document.wires.map((w) => [w.code, w.from, w.to])).toEqual([
		['G/B', { part: saved.document.parts[0].id, terminal: 'out' }, { part: saved.document.parts[1].id, terminal: 'feed' }]
	]);
	await page.reload();
	await expect(page.locator('[data-wire-id]')).toHaveAttribute('data-code', 'G/B');
	await expect(page.locator('[data-wire-id] [data-role="tracer"]')).toHaveAttribute('stroke', BLACK);
	await expect(page.locator('[data-part-id]')).toHaveCount(2);
});

test('deleting a part asks first when wires would go with it, and undo restores both', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Delete test loom');
	await page.goto(`/diagrams/${id}/draw`);
	await page.locator('[data-add-kind="battery"]').click();
	await page.locator('[data-add-kind="fuse"]').click();
	await drag(page, await centreOf(page, '[data-kind="battery"] [data-terminal="+"]'), await centreOf(page, '[data-kind="fuse"] [data-terminal="in"]'));
	await expect(page.locator('[data-wire-id]')).toHaveCount(1);
	await page.locator('[data-kind="fuse"] .caption').click();
	await page.keyboard.press('Delete');
	const dialog = page.getByRole('dialog', { name: 'Delete wires too?' });
	await expect(dialog).toBeVisible();
	await dialog.getByRole('button', { name: 'Delete with wires' }).click();
	await expect(page.locator('[data-kind="fuse"]')).toHaveCount(0);
	await expect(page.locator('[data-wire-id]')).toHaveCount(0);
	await page.keyboard.press('Control+z');
	await expect(page.locator('[data-kind="fuse"]')).toHaveCount(1);
	await expect(page.locator('[data-wire-id]')).toHaveCount(1);
});

test('the keyboard sheet spaces an action’s keys as "A or B"', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Shortcut sheet loom');
	await page.goto(`/diagrams/${id}/draw`);
	await page.getByRole('button', { name: 'Keyboard shortcuts' }).click();
	const sheet = page.getByRole('dialog', { name: 'Keyboard shortcuts' });
	await expect(sheet).toBeVisible();
	// Redo has two keys in the shortcut table (src/lib/editor/shortcuts.ts).
	const keys = sheet.locator('tr', { hasText: /redo/i }).first().locator('td:has(kbd)');
	await expect(keys).toHaveText(/^\s*\S+( or \S+)+\s*$/);
});
