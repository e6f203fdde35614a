import { expect, test } from '@playwright/test';
import { demoHarness } from '../../src/lib/circuit/demo';
import { signIn } from './editor-helpers';

// The seeded demo vehicle's "Complete harness" is demoHarness() (scripts/seed.ts), so parts and
// wires are found by their labels and ends there. Expected look: the feed outline is the
// copper #9a4a12 at 16 px, solid; the earth outline dashed (src/lib/components/editor/WireEdge.svelte).
const demo = demoHarness();
const byLabel = (label: string) => {
	const p = demo.parts.find((x) => x.label === label);
	if (!p) throw new Error(`demo has no part labelled ${label}`);
	return p;
};
const wireBetween = (from: string, to: string) => {
	const w = demo.wires.find((x) => `${x.from.part}.${x.from.terminal}` === from && `${x.to.part}.${x.to.terminal}` === to);
	if (!w) throw new Error(`demo has no wire ${from} → ${to}`);
	return w;
};

test('trace mode: two gauges show their shared feed, a sentence, feed styling and a reading', async ({ page }) => {
	await signIn(page);
	const list = await page.request.get('/api/diagrams');
	expect(list.ok()).toBe(true);
	const harness = ((await list.json()).diagrams as { id: string; title: string }[]).find((d) => d.title === 'Complete harness');
	expect(harness, 'the seeded demo diagram').toBeTruthy();
	await page.goto(`/diagrams/${harness!.id}/draw`);
	await expect(page.getByTestId('drawing-board')).toBeVisible();

	// Trace mode: editing is off (no part tray), the trace panel takes the properties' place.
	await page.locator('[data-mode="trace"]').click();
	await expect(page.locator('[data-mode="trace"]')).toHaveAttribute('aria-pressed', 'true');
	await expect(page.locator('[data-add-kind]')).toHaveCount(0);
	await expect(page.getByTestId('trace-panel')).toBeVisible();
	await expect(page.getByTestId('safety-note')).toContainText('does not replace your vehicle’s manual');

	const fuel = byLabel('Fuel gauge');
	const temp = byLabel('Coolant temperature gauge');
	const stabilizer = byLabel('Instrument voltage stabilizer');
	await page.locator(`[data-part-id="${fuel.id}"] .caption`).click();
	await page.locator(`[data-part-id="${temp.id}"] .caption`).click({ modifiers: ['Control'] });
	await expect(page.getByTestId('part-trace')).toHaveCount(2);

	// The shared point: the stabilizer's output, marked on the drawing and said in words.
	const marker = page.locator(`[data-part-id="${stabilizer.id}"] [data-role="shared-marker"][data-shared~="feed"]`);
	await expect(marker).toBeVisible();
	await expect(marker).toContainText('Shared feed');
	await expect(page.locator('[data-testid="shared-sentence"][data-side="feed"]')).toHaveText(
		`Both get their feed through terminal out of ${stabilizer.key} ${stabilizer.label}; a fault there or above it explains both.`
	);

	// Feed path wires: solid, thicker, copper outline. The fuse on the way is marked must-pass.
	const feedWire = page.locator(`[data-wire-id="${wireBetween(`${stabilizer.id}.out`, `${fuel.id}.feed`).id}"]`);
	await expect(feedWire).toHaveAttribute('data-trace', /feed/);
	const look = await feedWire.evaluate((g) => {
		const s = (sel: string) => getComputedStyle(g.querySelector(sel)!);
		return { outline: s('[data-role="feed-outline"]').stroke, width: s('[data-role="feed-outline"]').strokeWidth, dash: s('[data-role="feed-outline"]').strokeDasharray, base: s('[data-role="base"]').strokeWidth };
	});
	expect(look).toEqual({ outline: 'rgb(154, 74, 18)', width: '16px', dash: 'none', base: '9px' });
	const fuse = byLabel('Fuse, ignition accessories');
	await expect(page.locator(`[data-part-id="${fuse.id}"] [data-role="must-pass-badge"]`)).toContainText('Must pass');
	// Earth path wires are dashed (the fuel gauge earths by way of its sender).
	const sender = byLabel('Fuel tank sender');
	const earthWire = page.locator(`[data-wire-id="${demo.wires.find((w) => w.from.part === sender.id && w.from.terminal === 'earth')!.id}"]`);
	await expect(earthWire).toHaveAttribute('data-trace', /earth/);
	expect(await earthWire.evaluate((g) => getComputedStyle(g.querySelector('[data-role="earth-outline"]')!).strokeDasharray)).not.toBe('none');

	// Hover a terminal: the predicted DMM reading with its unit, and the test lamp.
	await page.locator(`[data-part-id="${fuel.id}"] [data-terminal="feed"]`).hover();
	const tip = page.getByTestId('reading-tooltip');
	await expect(tip).toBeVisible();
	// About 10 V from the stabilizer (common practice, DESIGN.md); positive earth reads negative.
	await expect(tip.getByTestId('reading-volts')).toHaveText(/^-(9\.\d\d|10\.\d\d) V$/);
	await expect(tip.getByTestId('reading-lamp')).toContainText('brightness');
	await page.screenshot({ path: '.data/test/trace-shared.png' });

	// The ignition switch is drawn in its scenario position: in "ign" (30 to 15 and 75) its blade lies on 75, the way drawn on its right.
	const blade = page.locator('[data-part-id="ignition"] [data-contact]');
	await expect(blade).toHaveAttribute('data-contact', 'closed 75');

	// Ignition off in the vehicle state: nothing is fed, the sentence says so, and the blade lifts.
	await page.getByTestId('scenario-panel').getByRole('button', { name: 'off', exact: true }).click();
	await expect(blade).toHaveAttribute('data-contact', 'open');
	await expect(page.locator('[data-testid="shared-sentence"][data-side="feed"]')).toContainText('No feed path at all reaches');
	await expect(page.locator('[data-wire-id][data-trace~="feed"]')).toHaveCount(0);

	// Back to drawing: the tray and the properties come back, the marks go; the switch is drawn at rest.
	await page.locator('[data-mode="draw"]').click();
	await expect(page.locator('[data-add-kind]').first()).toBeVisible();
	await expect(page.locator('[data-wire-id][data-trace]')).toHaveCount(0);
	await expect(blade).toHaveAttribute('data-contact', 'rest');
});
