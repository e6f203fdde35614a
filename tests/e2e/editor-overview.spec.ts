import { expect, test, type Page } from '@playwright/test';
import { generateLoom } from '../../scripts/bench/loom';
import { newDiagram, signIn } from './editor-helpers';

// A large loom (over 150 parts: the canvas draws only what is on screen) zoomed far out is
// drawn as one overview picture; zoomed back in, its parts are live again. Colours from the
// trade-letter palette's own data (R = red #d32f2f).

/** How many canvas pixels are (nearly) the given colour. */
async function pixelsOf(page: Page, rgb: [number, number, number]) {
	return page.getByTestId('loom-overview').evaluate((el, [r, g, b]) => {
		const c = el as HTMLCanvasElement;
		const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
		let n = 0;
		for (let i = 0; i < data.length; i += 4) if (Math.abs(data[i] - r) < 8 && Math.abs(data[i + 1] - g) < 8 && Math.abs(data[i + 2] - b) < 8 && data[i + 3] > 200) n++;
		return n;
	}, rgb);
}

const viewOf = (page: Page) =>
	page.locator('.svelte-flow__viewport').evaluate((el) => {
		const m = new DOMMatrixReadOnly(getComputedStyle(el).transform);
		return { x: m.e, y: m.f, zoom: m.a };
	});
const zoomOf = (page: Page) => page.locator('.svelte-flow__viewport').evaluate((el) => new DOMMatrixReadOnly(getComputedStyle(el).transform).a);

test('a large loom zoomed far out becomes an overview and comes back live, selection kept', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Overview loom', generateLoom(240, 420));
	await page.goto(`/diagrams/${id}/draw`);
	const part = page.locator('[data-part-id="p0"]');
	await expect(part).toBeVisible();
	await part.click();
	await expect(part).toHaveClass(/selected/);

	// "Zoom out" zooms out by 1.2 a click: from 0.9, six clicks give 0.9 / 1.2⁶ ≈ 0.30, below the
	// overview's 0.35.
	const out = page.getByRole('button', { name: 'Zoom out' });
	for (let i = 0; i < 6; i++) {
		await out.click();
		await page.waitForTimeout(220);
	}
	expect(await zoomOf(page)).toBeLessThan(0.35);
	await expect(page.getByTestId('loom-overview')).toBeVisible();
	await expect(page.getByRole('status').filter({ hasText: 'or zoom in, to pick and edit' })).toBeVisible();
	await expect(page.locator('[data-part-id]')).toHaveCount(0);
	await expect(page.locator('[data-wire-id]')).toHaveCount(0);
	// The red wires are on the picture, and the selected part in its selected fill (#f3dcc8).
	await expect.poll(() => pixelsOf(page, [0xd3, 0x2f, 0x2f])).toBeGreaterThan(50);
	await expect.poll(() => pixelsOf(page, [0xf3, 0xdc, 0xc8])).toBeGreaterThan(20);
	await page.screenshot({ path: test.info().outputPath('overview.png') });

	const zoomIn = page.getByRole('button', { name: 'Zoom in' });
	for (let i = 0; i < 6; i++) {
		await zoomIn.click();
		await page.waitForTimeout(220);
	}
	await expect(page.getByTestId('loom-overview')).toHaveCount(0);
	await expect(page.locator('[data-part-id]').first()).toBeVisible();
	await expect(page.locator('[data-part-id="p0"]')).toHaveClass(/selected/);

	// Out again, and a click on the overview zooms in on that place (to 0.8, centred on it).
	for (let i = 0; i < 6; i++) {
		await out.click();
		await page.waitForTimeout(220);
	}
	await expect(page.getByTestId('loom-overview')).toBeVisible();
	const pane = (await page.locator('.svelte-flow').boundingBox())!;
	const click = { x: pane.x + pane.width * 0.6, y: pane.y + pane.height * 0.6 };
	const before = await viewOf(page);
	const target = { x: (click.x - pane.x - before.x) / before.zoom, y: (click.y - pane.y - before.y) / before.zoom };
	await page.mouse.click(click.x, click.y);
	await expect(page.getByTestId('loom-overview')).toHaveCount(0);
	await expect(page.locator('[data-part-id]').first()).toBeVisible();
	await expect.poll(async () => (await viewOf(page)).zoom).toBeCloseTo(0.8, 2);
	const after = await viewOf(page);
	const centre = { x: (pane.width / 2 - after.x) / after.zoom, y: (pane.height / 2 - after.y) / after.zoom };
	expect(Math.abs(centre.x - target.x)).toBeLessThan(3);
	expect(Math.abs(centre.y - target.y)).toBeLessThan(3);
});
