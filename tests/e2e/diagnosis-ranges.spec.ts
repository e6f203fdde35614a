import { expect, test, type APIRequestContext } from '@playwright/test';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { documentOf, newDiagram, panelLampLoom, signIn, waitSaved } from './editor-helpers';

// What the drawing cannot know. The diagnosis page's panel: folded below the probe on a phone,
// the ranges in force with their sources (TRADE.md, "Tolerances for the uncertainty model"),
// changed by the owner and planned again, a stale version refused with the person's values kept.
// The drawing board: a wire's length marked measured. The looms are invented.
const DESKTOP = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };

async function startHunt(request: APIRequestContext): Promise<string> {
	const list = await request.get('/api/diagrams');
	const d = ((await list.json()).diagrams as { id: string; title: string; revision: number }[]).find((x) => x.title === 'Complete harness')!;
	const r = await request.post(`/api/diagrams/${d.id}/diagnoses`, { data: { revision: d.revision, marks: OPEN_HUNT.marks } });
	expect(r.status(), await r.text()).toBe(201);
	return (await r.json()).diagnosis.id as string;
}

test('the ranges in force: folded under the probe on a phone, changed and planned again, a stale change refused', async ({ page }, testInfo) => {
	test.setTimeout(180_000);
	await signIn(page);
	const id = await startHunt(page.request);

	await page.setViewportSize(PHONE);
	await page.goto(`/diagnoses/${id}`);
	const card = page.getByTestId('probe-card');
	const panel = page.getByTestId('ranges-panel');
	await expect(card).toBeVisible();
	await expect(panel).not.toHaveAttribute('open', '');
	// On a phone the folded panel comes after the probe, not before it.
	const cardBox = (await card.boundingBox())!;
	const panelBox = (await panel.boundingBox())!;
	expect(panelBox.y).toBeGreaterThan(cardBox.y + cardBox.height);
	await page.screenshot({ path: testInfo.outputPath('ranges-phone.png') });

	await page.setViewportSize(DESKTOP);
	await panel.locator('summary').click();
	const battery = panel.locator('[data-range="battery"]');
	await expect(battery).toContainText('Battery at rest: 11.9–12.8 V');
	await expect(battery).toContainText('BCI rest table');
	await expect(panel.locator('[data-range="lamps"]')).toContainText('from memory');
	await expect(panel.locator('[data-range="wires"]')).toContainText('±50 % unless measured');
	await expect(panel.locator('[data-range="stabilizer"]')).toContainText('enthusiast technical pages');
	await expect(panel.locator('[data-range="sender:fuel-sender"]')).toContainText('level unknown: anywhere on its travel');

	// Change the battery range and say the fuel level is known; saved and planned again.
	await panel.getByTestId('ranges-edit').click();
	const form = panel.getByTestId('ranges-form');
	await form.getByLabel('Battery, lowest volts').fill('12.1');
	await form.getByLabel('Battery, highest volts').fill('12.3');
	await form.locator('[data-sender="fuel-sender"] input[type="checkbox"]').check();
	await page.screenshot({ path: testInfo.outputPath('ranges-form-desktop.png'), fullPage: true });
	await form.getByTestId('ranges-save').click();
	await expect(form).toHaveCount(0, { timeout: 20_000 });
	await expect(battery).toHaveAttribute('data-changed', 'yes');
	await expect(battery).toContainText('12.1–12.6 V');
	await expect(panel.locator('[data-range="sender:fuel-sender"]')).toContainText('known: position');
	const stored = await (await page.request.get(`/api/diagnoses/${id}`)).json();
	expect(stored.diagnosis.uncertainty.battery).toEqual({ low: 12.1, high: 12.3 });
	expect(stored.diagnosis.uncertainty.knownSenders).toEqual(['fuel-sender']);

	// Someone else changes the diagnosis meanwhile: this page's version is stale.
	const other = await page.request.patch(`/api/diagnoses/${id}`, { data: { version: stored.diagnosis.version, title: 'Gauges low, second look' } });
	expect(other.status()).toBe(200);
	await panel.getByTestId('ranges-edit').click();
	await form.getByLabel('Battery, lowest volts').fill('12.0');
	await form.getByTestId('ranges-save').click();
	await expect(form.getByTestId('ranges-error')).toContainText('changed elsewhere');
	// The person's value stays, and nothing was stored.
	await expect(form.getByLabel('Battery, lowest volts')).toHaveValue('12.0');
	const after = await (await page.request.get(`/api/diagnoses/${id}`)).json();
	expect(after.diagnosis.uncertainty.battery).toEqual({ low: 12.1, high: 12.3 });
	await page.screenshot({ path: testInfo.outputPath('ranges-stale-desktop.png'), fullPage: true });
});

test('a wire\u2019s length marked measured on the drawing board, in the wire list and its properties, undoable and saved', async ({ page }, testInfo) => {
	await signIn(page);
	const id = await newDiagram(page.request, 'Measured lengths loom', panelLampLoom('negative'));
	await page.setViewportSize(DESKTOP);
	await page.goto(`/diagrams/${id}/draw`);
	const measuredOf = async (wire: string) => ((await documentOf(page.request, id)).document.wires as { id?: string; lengthMeasured?: boolean }[]).find((w) => w.id === wire)?.lengthMeasured;

	await page.getByRole('button', { name: 'Wire list' }).click();
	const table = page.getByRole('table', { name: 'Wire list' });
	await table.getByRole('checkbox', { name: 'Length measured of wire B from 12 earth to 3 stud' }).check();
	await waitSaved(page);
	expect(await measuredOf('w2')).toBe(true);

	// The G/B wire's properties: the box beside its length.
	await table.locator('[data-wire-row="w1"]').getByRole('button', { name: 'Show' }).click();
	const box = page.getByTestId('length-measured');
	await expect(box).not.toBeChecked();
	await box.check();
	await waitSaved(page);
	expect(await measuredOf('w1')).toBe(true);
	await expect(table.getByRole('checkbox', { name: 'Length measured of wire G/B from 7 2 to 12 feed' })).toBeChecked();
	await page.screenshot({ path: testInfo.outputPath('length-measured-board.png') });

	await page.getByRole('button', { name: /^Undo/ }).click();
	await expect(box).not.toBeChecked();
	await waitSaved(page);
	expect(await measuredOf('w1')).toBeUndefined();
	expect(await measuredOf('w2')).toBe(true);
});
