import { expect, test } from '@playwright/test';
import { documentOf, newDiagram, panelLampLoom, signIn, waitSaved } from './editor-helpers';

// Built-in colours from src/lib/circuit/palettes.ts (the trade single-letter set: G green
// #2e7d32, B black #1a1a1a, R red #d32f2f). The light-blue row and its screen colour are invented.
test('make a palette from a built-in, see the stripe live, use it in a diagram, and delete it', async ({ page }) => {
	await signIn(page);
	const name = `Workshop codes ${Date.now().toString(36)}`;
	await page.goto('/palettes');
	const form = page.getByRole('form', { name: 'New palette' });
	// A click before the page's script has arrived does nothing: press again until the form opens.
	await expect(async () => {
		await page.getByRole('button', { name: 'Duplicate Single-letter trade code' }).click();
		await expect(form.getByLabel('Palette name')).toHaveValue(/^My Single-letter trade code/, { timeout: 1000 });
	}).toPass({ timeout: 15_000 });
	await form.getByLabel('Palette name').fill(name);
	// The twelve trade colours came along.
	await expect(form.locator('[data-colour-row]')).toHaveCount(12);

	await form.getByRole('button', { name: 'Add a colour' }).click();
	const row = form.locator('[data-colour-row="12"]');
	// G is already row 4 (green): named as a problem beside the row before saving.
	await form.getByLabel('Code, row 13').fill('g');
	await expect(row.locator('[data-issue="colours[12].code"]')).toHaveText('"g" is defined twice (also row 4)');
	await form.getByLabel('Code, row 13').fill('LB');
	await expect(row.locator('[data-issue="colours[12].code"]')).toHaveCount(0);
	await form.getByLabel('Colour name, row 13').fill('light blue');
	await form.getByLabel('Screen colour as #rrggbb, row 13').fill('#81d4fa');
	// The wire is drawn live: light blue as the base, and as a tracer on a white base.
	await expect(row.locator('[data-preview="base"] path').nth(1)).toHaveAttribute('stroke', '#81d4fa');
	await expect(row.locator('[data-preview="tracer"] path').nth(2)).toHaveAttribute('stroke', '#81d4fa');
	await form.getByLabel('Try a code').fill('lb/r');
	await expect(form.getByTestId('try-code')).toContainText('light blue with red tracer');
	await expect(form.getByTestId('try-code').locator('path').nth(1)).toHaveAttribute('stroke', '#81d4fa');
	await expect(form.getByTestId('try-code').locator('path').nth(2)).toHaveAttribute('stroke', '#d32f2f');
	await form.screenshot({ path: `${process.env.LOOM_TEST_OUT ?? '.data/test'}/palette-editor.png` });
	await form.getByRole('button', { name: 'Save to my palettes' }).click();
	await expect(page.getByRole('status')).toContainText(`Saved “${name}” to your palettes.`);
	const card = page.getByRole('article', { name });
	await expect(card).toContainText('13 colours');
	await page.screenshot({ path: `${process.env.LOOM_TEST_OUT ?? '.data/test'}/palettes-page.png`, fullPage: true });

	const listed = await page.request.get('/api/palettes');
	const mine = ((await listed.json()).palettes as { id: string; name: string; colours: { code: string }[] }[]).find((p) => p.name === name)!;
	expect(mine.colours.map((c) => c.code)).toContain('LB');

	// A second palette without green, to see the report before switching.
	const noGreen = `No green ${Date.now().toString(36)}`;
	const made = await page.request.post('/api/palettes', { data: { name: noGreen, colours: [{ code: 'B', name: 'black', display: '#1a1a1a' }, { code: 'R', name: 'red', display: '#d32f2f' }] } });
	expect(made.status()).toBe(201);

	const id = await newDiagram(page.request, 'Palette choice loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	const chooser = page.getByLabel('Colour codes', { exact: true });
	await chooser.selectOption({ label: noGreen });
	const report = page.getByTestId('palette-report');
	await expect(report).toContainText(`Nothing changed: “${noGreen}” cannot write this code.`);
	await expect(report).toContainText('G/B: 1 wire (7 2 → 12 feed)');
	await expect(chooser).toHaveValue('trade-letters');

	await chooser.selectOption({ label: name });
	await expect(report).toHaveCount(0);
	await expect(chooser).toHaveValue(`account-${mine.id}`);
	await waitSaved(page);
	const doc = (await documentOf(page.request, id)).document as unknown as { palette: { id: string; name: string; colours: { code: string }[] }; wires: { code: string }[] };
	// Copied in whole; green and black keep their codes (same names in both palettes).
	expect(doc.palette).toMatchObject({ id: `account-${mine.id}`, name });
	expect(doc.palette.colours).toEqual(mine.colours);
	expect(doc.wires.map((w) => w.code)).toEqual(['G/B', 'B']);

	// The new colour is offered on the wire: LB/R draws light blue with a red tracer.
	await page.getByRole('button', { name: 'Wire list' }).click();
	const cell = page.getByRole('combobox', { name: 'Code of wire G/B from 7 2 to 12 feed' });
	await cell.fill('LB/R');
	await cell.press('Enter');
	await expect(page.locator('[data-wire-id="w1"] [data-role="base"]')).toHaveAttribute('stroke', '#81d4fa');
	await expect(page.locator('[data-wire-id="w1"] [data-role="tracer"]')).toHaveAttribute('stroke', '#d32f2f');
	await waitSaved(page);

	// Deleting the palette leaves the diagram's copy alone.
	await page.goto('/palettes');
	await expect(page.getByRole('article', { name })).toContainText('used by Palette choice loom');
	await page.getByRole('button', { name: `Delete ${name}` }).click();
	const dialog = page.getByRole('dialog', { name: 'Delete this palette?' });
	await expect(dialog).toContainText('The diagram that uses it keeps its own copy.');
	await dialog.getByRole('button', { name: 'Delete palette' }).click();
	await expect(page.getByRole('status')).toContainText(`Deleted “${name}”.`);
	await expect(page.locator(`[data-palette-id="${mine.id}"]`)).toHaveCount(0);
	// The diagram's copy is still listed, now as one kept inside that diagram.
	await expect(page.getByRole('region', { name: 'Kept inside a diagram' }).getByRole('article', { name })).toContainText('In Palette choice loom');
	const after = (await documentOf(page.request, id)).document as unknown as { palette: { id: string }; wires: { code: string }[] };
	expect(after.palette.id).toBe(`account-${mine.id}`);
	expect(after.wires.map((w) => w.code)).toEqual(['LB/R', 'B']);
	await page.reload();
	// Still drawn from its own copy after the library palette is gone.
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.locator('[data-wire-id="w1"] [data-role="base"]')).toHaveAttribute('stroke', '#81d4fa');
	await expect(page.getByLabel('Colour codes', { exact: true })).toHaveValue(`account-${mine.id}`);
});
