import { expect, test } from '@playwright/test';
import { newDiagram, panelLampLoom, signIn } from './editor-helpers';

// The read-only link is shown only once: a Copy button puts it on the clipboard. The loom is invented.
test('a new read-only link has a Copy button that puts the link on the clipboard', async ({ page, context }) => {
	await context.grantPermissions(['clipboard-read', 'clipboard-write']);
	await signIn(page);
	const id = await newDiagram(page.request, 'Linked loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/share`);
	await page.getByRole('button', { name: 'Make a read-only link' }).click();
	const link = page.getByLabel('The new read-only link');
	await expect(link).toHaveValue(/\/s\/\S+$/);
	await page.getByTestId('copy-link').click();
	await expect(page.getByTestId('copy-status')).toHaveText('Copied to the clipboard.');
	expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(await link.inputValue());
});
