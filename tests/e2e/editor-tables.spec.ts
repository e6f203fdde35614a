import { expect, test } from '@playwright/test';
import { newDiagram, panelLampLoom, signIn, waitSaved, documentOf } from './editor-helpers';

// Screen colours from the trade-letter palette's data (src/lib/circuit/palettes.ts):
// R red #d32f2f, W white #f5f5f5, G green #2e7d32, B black #1a1a1a.
const doc = panelLampLoom('negative');

test('editing a code in the wire list changes the drawn stripe', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Table test loom', doc);
	await page.goto(`/diagrams/${id}/draw`);
	const drawn = page.locator('[data-wire-id="w1"]');
	await expect(drawn.locator('[data-role="base"]')).toHaveAttribute('stroke', '#2e7d32');

	await page.getByRole('button', { name: 'Wire list' }).click();
	const table = page.getByRole('table', { name: 'Wire list' });
	await expect(table.locator('tbody tr')).toHaveCount(2);

	// Filter to one code: only the G/B wire is listed.
	await page.getByLabel('Show wires of code').selectOption('G/B');
	await expect(table.locator('tbody tr')).toHaveCount(1);

	const cell = table.getByRole('combobox', { name: 'Code of wire G/B from 7 2 to 12 feed' });
	await cell.fill('r/w');
	await cell.press('Enter');
	await expect(drawn).toHaveAttribute('data-code', 'R/W');
	await expect(drawn.locator('[data-role="base"]')).toHaveAttribute('stroke', '#d32f2f');
	await expect(drawn.locator('[data-role="tracer"]')).toHaveAttribute('stroke', '#f5f5f5');

	// Sort the component key by key number: manual order 3, 7, 12 (not 12, 3, 7).
	await page.getByRole('button', { name: 'Component key' }).click();
	const key = page.getByRole('table', { name: 'Component key' });
	await expect.poll(() => key.locator('tbody tr td:first-child input').evaluateAll((els) => els.map((e) => (e as HTMLInputElement).value))).toEqual(['3', '7', '12']);
	await key.getByRole('textbox', { name: 'Label of part 12' }).fill('Speedometer lamp');
	await key.getByRole('textbox', { name: 'Label of part 12' }).press('Enter');
	await expect(page.locator('[data-part-id="lamp"] .label')).toHaveText('Speedometer lamp');

	// One history: undo the label, then the code.
	await page.getByRole('button', { name: /^Undo/ }).click();
	await expect(page.locator('[data-part-id="lamp"] .label')).toHaveText('Panel lamp');
	await page.getByRole('button', { name: /^Undo/ }).click();
	await expect(drawn.locator('[data-role="base"]')).toHaveAttribute('stroke', '#2e7d32');
	await page.getByRole('button', { name: /^Redo/ }).click();
	await expect(drawn).toHaveAttribute('data-code', 'R/W');
	await waitSaved(page);
	expect((await documentOf(page.request, id)).document.wires.map((w) => w.code)).toEqual(['R/W', 'B']);
	await page.screenshot({ path: '.data/test/editor-tables.png' });
});
