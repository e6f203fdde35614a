import { expect, test } from '@playwright/test';
import { newDiagram, panelLampLoom, signIn } from './editor-helpers';

// From the drawing board to one wire's comments: the side panel counts them and opens the
// comments page at that wire, with the wire chosen for a new comment. The loom is invented.
test('a selected wire shows its comment count and opens its comments; a part without any offers to start one', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Commented loom', panelLampLoom('negative'));
	const posted = await page.request.post(`/api/diagrams/${id}/comments`, { data: { body: 'This G/B runs behind the glovebox on mine.', target: 'wire', targetId: 'w1' } });
	expect(posted.status(), await posted.text()).toBe(201);
	await page.request.post(`/api/diagrams/${id}/comments`, { data: { body: 'A note on the whole loom.' } });

	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.getByTestId('drawing-board')).toBeVisible();
	await page.getByRole('button', { name: 'Component key' }).click();
	await page.getByRole('table', { name: 'Component key' }).getByRole('row', { name: /Panel lamp/ }).getByRole('button', { name: 'Show' }).click();
	await expect(page.getByTestId('comments-link')).toHaveText('Comment on this part');

	await page.getByRole('button', { name: 'Wire list' }).click();
	await page.getByRole('table', { name: 'Wire list' }).getByRole('row', { name: /G\/B/ }).getByRole('button', { name: 'Show' }).click();
	const link = page.getByTestId('comments-link');
	await expect(link).toHaveText('Comments on this wire (1)');
	await link.click();

	await expect(page).toHaveURL(new RegExp(`/diagrams/${id}/comments\\?about=wire:w1$`));
	await expect(page.getByRole('heading', { name: 'On Wire G/B from 7 Panel switch, terminal 2 to 12 Panel lamp, terminal feed' })).toBeVisible();
	await expect(page.getByTestId('comment')).toHaveCount(1);
	await expect(page.getByTestId('comment')).toContainText('behind the glovebox');
	await expect(page.getByLabel('About')).toHaveValue('wire:w1');
	// "All comments" shows the whole-loom note too.
	await page.getByRole('link', { name: 'All comments' }).click();
	await expect(page.getByTestId('comment')).toHaveCount(2);
});
