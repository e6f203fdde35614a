import { expect, test } from '@playwright/test';
import { documentOf, newDiagram, panelLampLoom, signIn } from './editor-helpers';

// The history page: a revision says what it changed against the one before, and its drawing
// shows the changed wire selected. The loom is the invented panel-lamp one.
test('a viewed revision lists its changes and shows the changed wire selected', async ({ page }) => {
	await signIn(page);
	const loom = panelLampLoom('negative');
	const id = await newDiagram(page.request, 'History test loom', loom);
	const recoloured = { ...loom, wires: loom.wires.map((w) => (w.id === 'w1' ? { ...w, code: 'R/W' } : w)) };
	const put = await page.request.put(`/api/diagrams/${id}`, { data: { revision: 1, document: recoloured } });
	expect(put.status(), await put.text()).toBe(200);
	expect((await documentOf(page.request, id)).revision).toBe(2);

	await page.goto(`/diagrams/${id}/revisions?view=2`);
	// The history list gives each revision's one-line summary of what it changed.
	await expect(page.locator('tr[data-revision="2"] [data-testid="revision-summary"]')).toHaveText('Wire R/W (red with white tracer) between terminal 2 of 7 (Panel switch) and terminal feed of 12 (Panel lamp): code G/B → R/W');
	await expect(page.locator('tr[data-revision="1"] [data-testid="revision-summary"]')).toHaveText('First revision');
	await expect(page.getByTestId('revision-changes').locator('li')).toHaveText(['Wire R/W (red with white tracer) between terminal 2 of 7 (Panel switch) and terminal feed of 12 (Panel lamp): code G/B → R/W']);
	const drawing = page.getByTestId('revision-drawing');
	await expect(drawing.locator('[data-wire-id="w1"]')).toHaveClass(/\bselected\b/);
	await expect(drawing.locator('[data-wire-id="w2"]')).not.toHaveClass(/\bselected\b/);
	await page.screenshot({ path: '.data/test/history-changes.png', fullPage: true });

	// Revision 1 has nothing before it to compare with.
	await page.goto(`/diagrams/${id}/revisions?view=1`);
	await expect(page.getByTestId('revision-drawing')).toBeVisible();
	await expect(page.getByText(/What changed since/)).toHaveCount(0);
});
