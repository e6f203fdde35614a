import { expect, test } from '@playwright/test';
import { documentOf, newDiagram, signIn, waitSaved } from './editor-helpers';

// The revision contract (DEVELOPERS.md, API conventions): a save names the revision it edits;
// a stale one gets 409 and overwrites nothing. Two people editing the same diagram must both
// keep their work.
test('two people edit one diagram: the second is told, and neither edit is lost', async ({ browser }) => {
	const first = await browser.newContext();
	const second = await browser.newContext();
	const a = await first.newPage();
	const b = await second.newPage();
	await signIn(a);
	await signIn(b);
	const id = await newDiagram(a.request, 'Shared loom');

	await a.goto(`/diagrams/${id}/draw`);
	await b.goto(`/diagrams/${id}/draw`);
	await expect(a.getByTestId('drawing-board')).toBeVisible();
	await expect(b.getByTestId('drawing-board')).toBeVisible();

	// A adds a fuse and it saves as revision 2.
	await a.locator('[data-add-kind="fuse"]').click();
	await waitSaved(a);
	expect((await documentOf(a.request, id)).revision).toBe(2);

	// B, still on revision 1, adds a lamp: its save is refused and B is told.
	await b.locator('[data-add-kind="lamp"]').click();
	const conflict = b.getByTestId('conflict');
	await expect(conflict).toBeVisible({ timeout: 15_000 });
	await expect(conflict).toContainText('revision 2');
	await expect(b.locator('[data-save-state]')).toHaveAttribute('data-save-state', 'conflict');
	// B's lamp is still on screen; A's save is untouched on the server.
	await expect(b.locator('[data-kind="lamp"]')).toHaveCount(1);
	const server = await documentOf(a.request, id);
	expect(server.document.parts.map((p) => p.kind)).toEqual(['fuse']);

	// B keeps theirs as a new diagram: both edits now exist.
	await conflict.getByRole('button', { name: 'Keep mine as a new diagram' }).click();
	await b.waitForURL((url) => /\/diagrams\/[0-9a-f-]+\/draw$/.test(url.pathname) && !url.pathname.includes(id));
	const copyId = b.url().split('/').at(-2)!;
	const copy = await documentOf(b.request, copyId);
	expect(copy.document.parts.map((p) => p.kind)).toEqual(['lamp']);
	expect((await documentOf(a.request, id)).document.parts.map((p) => p.kind)).toEqual(['fuse']);
	await expect(b.locator('[data-kind="lamp"]')).toHaveCount(1);

	await first.close();
	await second.close();
});

test('loading the other save shows it, and undo brings the local edits back', async ({ browser }) => {
	const first = await browser.newContext();
	const second = await browser.newContext();
	const a = await first.newPage();
	const b = await second.newPage();
	await signIn(a);
	await signIn(b);
	const id = await newDiagram(a.request, 'Shared loom two');
	await a.goto(`/diagrams/${id}/draw`);
	await b.goto(`/diagrams/${id}/draw`);
	await a.locator('[data-add-kind="relay"]').click();
	await waitSaved(a);
	await b.locator('[data-add-kind="gauge"]').click();
	const conflict = b.getByTestId('conflict');
	await expect(conflict).toBeVisible({ timeout: 15_000 });
	await conflict.getByRole('button', { name: /Load theirs/ }).click();
	await expect(conflict).toBeHidden();
	await expect(b.locator('[data-kind="relay"]')).toHaveCount(1);
	await expect(b.locator('[data-kind="gauge"]')).toHaveCount(0);
	await b.getByRole('button', { name: /^Undo/ }).click();
	await expect(b.locator('[data-kind="gauge"]')).toHaveCount(1);
	await first.close();
	await second.close();
});
