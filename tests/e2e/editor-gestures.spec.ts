import { expect, test, type Page } from '@playwright/test';
import { centreOf, documentOf, newDiagram, panelLampLoom, signIn, waitSaved } from './editor-helpers';

// The invented panel-lamp loom (editor-helpers.ts): switch 7 at (0,0), lamp 12 at (320,60),
// earth 3 at (560,200); w1 G/B from 7 terminal 2 to 12 feed. Expected routes follow the
// orthogonal-route rule worked by hand in src/lib/editor/route.spec.ts.
type Point = { x: number; y: number };
type SavedWire = { id: string; code: string; waypoints?: Point[]; from: { part: string; terminal: string }; to: { part: string; terminal: string } };
type SavedPart = { id: string; kind: string; key: string; label: string; position: Point; terminals: string[] };

const pointsOf = (d: string): Point[] => [...d.matchAll(/[ML] (-?[\d.]+) (-?[\d.]+)/g)].map((m) => ({ x: Number(m[1]), y: Number(m[2]) }));

/** The canvas's pan and zoom, from the viewport transform xyflow sets (translate, then scale). */
async function viewportOf(page: Page) {
	return page.locator('.svelte-flow__viewport').evaluate((el) => {
		const m = new DOMMatrixReadOnly(getComputedStyle(el).transform);
		const pane = el.closest('.svelte-flow')!.getBoundingClientRect();
		return { x: m.e, y: m.f, zoom: m.a, left: pane.left, top: pane.top };
	});
}

/** A point halfway along a wire, on screen (the code label there lets clicks through). */
async function onWire(page: Page, id: string): Promise<Point> {
	return page.locator(`[data-wire-id="${id}"] [data-role="base"]`).evaluate((el) => {
		const path = el as SVGPathElement;
		const p = path.getPointAtLength(path.getTotalLength() / 2);
		const m = path.getScreenCTM()!;
		return { x: p.x * m.a + m.e, y: p.y * m.d + m.f };
	});
}

async function slowDrag(page: Page, from: Point, to: Point) {
	await page.mouse.move(from.x, from.y);
	await page.mouse.down();
	for (let i = 1; i <= 10; i++) await page.mouse.move(from.x + ((to.x - from.x) * i) / 10, from.y + ((to.y - from.y) * i) / 10);
	await page.mouse.up();
}

test('drag a wire’s run sideways: the bend is drawn, saved as waypoints, undone, redone and kept on reload', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Bend test loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	const base = page.locator('[data-wire-id="w1"] [data-role="base"]');
	await expect(base).toBeVisible();
	const before = pointsOf((await base.getAttribute('d'))!);
	// A Z route: out of the switch, a vertical run in the middle, into the lamp.
	expect(before).toHaveLength(4);
	expect(before[1].x).toBe(before[2].x);

	const at = await onWire(page, 'w1');
	await page.mouse.click(at.x, at.y);
	const handle = page.locator('[data-wire-id="w1"] [data-bend-handle="1"]');
	await expect(handle).toBeVisible();
	const { zoom } = await viewportOf(page);
	// 40 px to the right and 30 down: only the sideways part moves a vertical run.
	const h = await centreOf(page, '[data-wire-id="w1"] [data-bend-handle="1"]');
	await slowDrag(page, h, { x: h.x + 40, y: h.y + 30 });
	const dx = Math.round(40 / zoom);

	const bent = pointsOf((await base.getAttribute('d'))!);
	expect(bent).toHaveLength(4);
	expect(bent[1].x).toBeCloseTo(before[1].x + dx, -0.5);
	expect(bent[2].x).toBe(bent[1].x);
	expect([bent[0], bent[3]]).toEqual([before[0], before[3]]);
	expect(bent[1].y).toBe(before[1].y);
	await page.screenshot({ path: `${process.env.LOOM_TEST_OUT ?? '.data/test'}/editor-bend.png` });

	await waitSaved(page);
	const saved = (await documentOf(page.request, id)).document.wires as unknown as SavedWire[];
	expect(saved.find((w) => w.id === 'w1')!.waypoints).toEqual([
		{ x: bent[1].x, y: bent[1].y },
		{ x: bent[2].x, y: bent[2].y }
	]);

	await page.getByRole('button', { name: 'Undo: Bend wire G/B' }).click();
	expect(pointsOf((await base.getAttribute('d'))!)).toEqual(before);
	await page.getByRole('button', { name: 'Redo: Bend wire G/B' }).click();
	expect(pointsOf((await base.getAttribute('d'))!)).toEqual(bent);
	await waitSaved(page);
	await page.reload();
	await expect(base).toBeVisible();
	expect(pointsOf((await base.getAttribute('d'))!)).toEqual(bent);
	// "Route automatically" takes the bend out again.
	const again = await onWire(page, 'w1');
	await page.mouse.click(again.x, again.y);
	await page.getByRole('button', { name: 'Route automatically' }).click();
	expect(pointsOf((await base.getAttribute('d'))!)).toEqual(before);
});

test('move a wire’s run with the keyboard: arrows step it, the other axis is ignored, one undo takes all the steps back', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Keyboard bend loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	const base = page.locator('[data-wire-id="w1"] [data-role="base"]');
	await expect(base).toBeVisible();
	const before = pointsOf((await base.getAttribute('d'))!);
	const at = await onWire(page, 'w1');
	await page.mouse.click(at.x, at.y);
	const handle = page.locator('[data-wire-id="w1"] [data-bend-handle="1"]');
	await handle.focus();
	// The middle run of the Z is vertical: right three steps of 8 and one Shift step of 40 move
	// it 64 to the right; up and down do nothing to it.
	for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight');
	await page.keyboard.press('ArrowUp');
	await page.keyboard.press('Shift+ArrowRight');
	await expect(handle).toBeFocused();
	const moved = pointsOf((await base.getAttribute('d'))!);
	expect(moved).toHaveLength(4);
	expect([moved[1].x, moved[2].x]).toEqual([before[1].x + 64, before[2].x + 64]);
	expect([moved[0], moved[3], moved[1].y, moved[2].y]).toEqual([before[0], before[3], before[1].y, before[2].y]);
	await waitSaved(page);
	const saved = (await documentOf(page.request, id)).document.wires as unknown as SavedWire[];
	expect(saved.find((w) => w.id === 'w1')!.waypoints).toEqual([moved[1], moved[2]]);
	// All the presses on that run were one edit.
	await page.getByRole('button', { name: 'Undo: Bend wire G/B' }).click();
	expect(pointsOf((await base.getAttribute('d'))!)).toEqual(before);
	await expect(page.getByRole('button', { name: 'Undo', exact: true })).toBeDisabled();
});

test('drag a part from the tray onto the drawing: it lands with its middle where it was dropped', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Drop test loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.locator('[data-part-id]')).toHaveCount(3);
	const pane = (await page.locator('.svelte-flow').boundingBox())!;
	// Low on the left of the drawing, away from the middle where a tap would put it.
	const drop = { x: Math.round(pane.x + pane.width * 0.25), y: Math.round(pane.y + pane.height * 0.8) };
	await page.locator('[data-add-kind="relay"]').dragTo(page.locator('.svelte-flow__pane'), { targetPosition: { x: drop.x - pane.x, y: drop.y - pane.y } });

	const relay = page.locator('[data-kind="relay"]');
	await expect(relay).toHaveCount(1);
	// Next free key after 3, 7, 12 is 13.
	await expect(relay).toHaveAttribute('data-key', '13');
	const box = (await relay.boundingBox())!;
	expect(Math.abs(box.x + box.width / 2 - drop.x)).toBeLessThanOrEqual(2);
	expect(Math.abs(box.y + box.height / 2 - drop.y)).toBeLessThanOrEqual(2);

	// In drawing units: (screen − pan) / zoom, less half the part's size.
	const v = await viewportOf(page);
	const size = await relay.evaluate((el) => ({ width: (el as HTMLElement).offsetWidth, height: (el as HTMLElement).offsetHeight }));
	await waitSaved(page);
	const parts = (await documentOf(page.request, id)).document.parts as unknown as SavedPart[];
	const saved = parts.find((p) => p.kind === 'relay')!;
	expect(Math.abs(saved.position.x - ((drop.x - v.left - v.x) / v.zoom - size.width / 2))).toBeLessThanOrEqual(1.5);
	expect(Math.abs(saved.position.y - ((drop.y - v.top - v.y) / v.zoom - size.height / 2))).toBeLessThanOrEqual(1.5);
	// One undo step takes it away.
	await page.getByRole('button', { name: 'Undo: Add relay' }).click();
	await expect(relay).toHaveCount(0);
});

test('change a part’s kind: key, label and matching wires stay; dropping wires is asked first; one undo', async ({ page }) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Kind test loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	await page.locator('[data-part-id="lamp"] .caption').click();
	const kind = page.getByLabel('Kind', { exact: true });
	await expect(kind).toHaveValue('lamp');

	// A motor has feed and earth, like the lamp: no question, both wires stay.
	await kind.selectOption('motor');
	const part = page.locator('[data-part-id="lamp"]');
	await expect(part).toHaveAttribute('data-kind', 'motor');
	await expect(part).toHaveAttribute('data-key', '12');
	await expect(part.locator('.label')).toHaveText('Panel lamp');
	await expect(page.locator('[data-wire-id]')).toHaveCount(2);

	// A fuse has in and out: both wires would go, so it asks; keeping the kind changes nothing.
	await kind.selectOption('fuse');
	const dialog = page.getByRole('dialog', { name: 'Drop wires with the change?' });
	await expect(dialog).toBeVisible();
	await expect(dialog).toContainText('A fuse has no terminal feed or earth.');
	await expect(dialog).toContainText('G/B from 7 2 to 12 feed');
	await expect(dialog).toContainText('B from 12 earth to 3 stud');
	await dialog.getByRole('button', { name: 'Keep the kind' }).click();
	await expect(part).toHaveAttribute('data-kind', 'motor');
	await expect(kind).toHaveValue('motor');
	await expect(page.locator('[data-wire-id]')).toHaveCount(2);

	await kind.selectOption('fuse');
	await dialog.getByRole('button', { name: 'Change and drop wires' }).click();
	await expect(part).toHaveAttribute('data-kind', 'fuse');
	await expect(page.locator('[data-wire-id]')).toHaveCount(0);
	await waitSaved(page);
	const saved = (await documentOf(page.request, id)).document as unknown as { parts: SavedPart[]; wires: SavedWire[] };
	expect(saved.parts.find((p) => p.id === 'lamp')).toMatchObject({ kind: 'fuse', key: '12', label: 'Panel lamp', terminals: ['in', 'out'] });
	expect(saved.wires).toEqual([]);

	// One step back: the motor with both wires.
	await page.getByRole('button', { name: 'Undo: Change part 12 to fuse' }).click();
	await expect(part).toHaveAttribute('data-kind', 'motor');
	await expect(page.locator('[data-wire-id]')).toHaveCount(2);
});

test('slide a part out of the tray with a finger onto the drawing: it lands under the finger', async ({ browser }) => {
	const context = await browser.newContext({ hasTouch: true });
	const page = await context.newPage();
	await signIn(page);
	const id = await newDiagram(page.request, 'Touch drop loom', panelLampLoom('negative'));
	await page.goto(`/diagrams/${id}/draw`);
	await expect(page.locator('[data-part-id]')).toHaveCount(3);
	const pane = (await page.locator('.svelte-flow').boundingBox())!;
	const from = await centreOf(page, '[data-add-kind="gauge"]');
	const drop = { x: Math.round(pane.x + pane.width * 0.3), y: Math.round(pane.y + pane.height * 0.75) };
	// Real touch input through the browser's own touch events (Chrome DevTools Protocol).
	const cdp = await context.newCDPSession(page);
	const touch = (type: 'touchStart' | 'touchMove' | 'touchEnd', p?: Point) => cdp.send('Input.dispatchTouchEvent', { type, touchPoints: p ? [{ x: p.x, y: p.y }] : [] });
	await touch('touchStart', from);
	for (let i = 1; i <= 12; i++) await touch('touchMove', { x: from.x + ((drop.x - from.x) * i) / 12, y: from.y + ((drop.y - from.y) * i) / 12 });
	await expect(page.getByTestId('tray-ghost')).toContainText('Gauge');
	await touch('touchEnd');
	const gauge = page.locator('[data-kind="gauge"]');
	await expect(gauge).toHaveCount(1);
	await expect(page.getByTestId('tray-ghost')).toHaveCount(0);
	const box = (await gauge.boundingBox())!;
	expect(Math.abs(box.x + box.width / 2 - drop.x)).toBeLessThanOrEqual(2);
	expect(Math.abs(box.y + box.height / 2 - drop.y)).toBeLessThanOrEqual(2);
	// A plain tap still adds one in the middle of the view.
	await page.locator('[data-add-kind="fuse"]').tap();
	await expect(page.locator('[data-kind="fuse"]')).toHaveCount(1);
	// Once: the click the browser sends after the tap does not add a second.
	await page.waitForTimeout(800);
	await expect(page.locator('[data-kind="fuse"]')).toHaveCount(1);
	await context.close();
});
