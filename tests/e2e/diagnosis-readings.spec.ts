import { expect, test, type Page, type TestInfo } from '@playwright/test';
import type { FaultKind } from '../../src/lib/circuit/faults';
import { groupAction } from '../../src/lib/circuit/groups';
import type { ChecklistStep } from '../../src/lib/circuit/plan';
import { OPEN_HUNT } from '../../src/lib/diagnosis/demo';
import { towardGroup } from '../../src/lib/diagnosis/testing/walk';
import { signIn } from './editor-helpers';

// The seeded demo's open hunt (scripts/seed.ts; both gauges low on the invented demo harness),
// taken as in a garage: the battery first, a reading no suspect explains (kept, explained, taken
// again), then readings that end on suspects no probe tells apart, concluded with their one job.
// The readings come from the stateless plan of the same marks (the probe-plan API), which makes
// the same plan the page makes from the same readings.

const BATTERY = 'volts:battery:-';
const DESKTOP = { width: 1280, height: 800 };
const PHONE = { width: 390, height: 844 };

type StatelessPlan = {
	suspects: { id: string; label: string; kind: FaultKind | 'double' }[];
	plan: { steps: ChecklistStep[] };
	readings?: { remaining: { suspect: string }[]; unexplained: { probe: string; explanation: { text: string } }[] };
};

async function statelessPlan(page: Page, diagramId: string, readings: Record<string, number>): Promise<StatelessPlan> {
	const r = await page.request.post(`/api/diagrams/${diagramId}/probe-plan`, { data: { marks: OPEN_HUNT.marks, readings } });
	expect(r.status(), await r.text()).toBe(200);
	return r.json();
}

/** Puts `probe` on the card (from the list of other probes when the plan offers another) and waits for its entry. */
async function onCard(page: Page, probe: string) {
	const card = page.getByTestId('probe-card');
	if ((await card.getAttribute('data-probe')) !== probe) await page.locator('#other-probe').selectOption(probe);
	await expect(card).toHaveAttribute('data-probe', probe);
	await expect(card.getByTestId('reading-input')).toBeVisible({ timeout: 30_000 });
}

/** Types a reading on the card and waits until it is stored and the plan is made again from it. */
async function enter(page: Page, value: string) {
	const card = page.getByTestId('probe-card');
	const probe = (await card.getAttribute('data-probe'))!;
	const logged = page.locator(`[data-testid="logged-reading"][data-probe="${probe}"]`);
	const before = await logged.count();
	await card.getByTestId('reading-input').fill(value);
	await card.getByTestId('save-reading').click();
	await expect(logged).toHaveCount(before + 1);
	await expect(page.getByTestId('connection')).toHaveAttribute('data-queued', '0', { timeout: 20_000 });
	await expect(page.getByText('Planning again…')).toHaveCount(0, { timeout: 30_000 });
}

/** The page at desktop and phone sizes, whole, for looking at by eye. */
async function shots(page: Page, testInfo: TestInfo, name: string) {
	await page.screenshot({ path: testInfo.outputPath(`${name}-desktop.png`), fullPage: true });
	await page.setViewportSize(PHONE);
	await page.screenshot({ path: testInfo.outputPath(`${name}-phone.png`), fullPage: true });
	await page.setViewportSize(DESKTOP);
}

test('the battery first, a reading no suspect explains kept and taken again, then a group and its one job in the conclusion', async ({ page }, testInfo) => {
	test.setTimeout(300_000);
	await page.setViewportSize(DESKTOP);
	await signIn(page);
	const diagrams = (await (await page.request.get('/api/diagrams')).json()).diagrams as { id: string; title: string }[];
	const diagramId = diagrams.find((d) => d.title === 'Complete harness')!.id;

	await page.goto('/garage');
	await page.getByRole('link', { name: /The Ostrimmel/ }).first().click();
	await page.locator('[data-testid="timeline-entry"][data-status="open"]', { hasText: OPEN_HUNT.title }).getByRole('link').first().click();
	await page.waitForURL(/\/diagnoses\/[0-9a-f-]{36}$/);
	const path = new URL(page.url()).pathname;

	// The page's data stays small: every probe by name, the next one in full (view.ts).
	const data = await page.request.get(`${path}/__data.json`);
	const bytes = (await data.body()).length;
	testInfo.annotations.push({ type: 'page data', description: `${bytes} bytes` });
	expect(bytes).toBeLessThan(100_000);

	// Step 1: the battery at its posts, with why, what it should read, and the battery caution.
	const card = page.getByTestId('probe-card');
	await expect(card).toHaveAttribute('data-probe', BATTERY);
	await expect(page.getByRole('heading', { name: 'First probe: the battery' })).toBeVisible();
	const why = card.getByTestId('battery-step');
	await expect(why).toContainText('not the clamps');
	await expect(why).toContainText('below 12.0 V, charge it and let it rest some hours');
	// The usual battery caution (TRADE.md, Safety).
	for (const words of ['rings, watches', 'insulated tools', 'eye protection', 'sparks or flames', 'earth lead off first']) await expect(card.getByTestId('battery-caution')).toContainText(words);
	// Every prediction is a band.
	await expect(card.getByTestId('expected-group').first()).toContainText(/\u2212\d+\.\d\d to \u2212\d+\.\d\d V/);
	await shots(page, testInfo, '1-battery');

	// A charged battery: the page says so, and the plan goes on.
	await onCard(page, BATTERY);
	await enter(page, '-12.40');
	await expect(page.getByTestId('battery-read')).toContainText('\u221212.40 V at its posts');
	await expect(page.getByTestId('battery-read')).toContainText('charged enough to go on');
	await expect(page.getByTestId('charge-battery')).toHaveCount(0);

	// A reading no suspect explains: +5 V on a volts probe to earth. Positive earth: every feed reads
	// between the battery's negative EMF and 0 V, so +5 V lies beyond every band.
	const afterBattery = await statelessPlan(page, diagramId, { [BATTERY]: -12.4 });
	const next = afterBattery.plan.steps[0].probe;
	const odd = next.startsWith('volts:') ? next : 'volts:fuse-ign:in';
	await onCard(page, odd);
	await enter(page, '5');
	const expected = await statelessPlan(page, diagramId, { [BATTERY]: -12.4, [odd]: 5 });
	expect(expected.readings!.unexplained.map((u) => u.probe)).toEqual([odd]);
	const shown = page.locator(`[data-testid="unexplained"][data-probe="${odd}"]`);
	await expect(shown.getByTestId('explanation')).toHaveText(expected.readings!.unexplained[0].explanation.text);
	await expect(shown).toContainText('It is kept, and the diagnosis goes on.');
	await expect(shown.getByTestId('nearest')).toContainText('Nearest suspects, marked in the list:');
	await expect(page.locator('[data-testid="suspect"][data-outside="yes"]').first()).toContainText('Outside what the drawing predicts');
	await expect(page.getByTestId('unexplained-badge')).toHaveCount(1);
	// The diagnosis goes on: the next probe of the plan made with the reading kept.
	await expect(page.getByRole('heading', { name: 'Next probe' })).toBeVisible();
	await expect(card).toHaveAttribute('data-probe', expected.plan.steps[0].probe);
	await expect(card.getByTestId('reading-input')).toBeVisible();
	await shots(page, testInfo, '2-unexplained');

	// Take it again: the same probe back on the card; the new reading replaces the odd one.
	await shown.getByTestId('take-again').click();
	await expect(card).toHaveAttribute('data-probe', odd);
	await expect(page.getByRole('heading', { name: 'Take it again' })).toBeVisible();
	await expect(card.getByTestId('reading-input')).toBeVisible({ timeout: 30_000 });
	const readings: Record<string, number> = { [BATTERY]: -12.4 };
	const again = towardGroup(afterBattery.plan.steps, odd) ?? { probe: odd, reading: afterBattery.plan.steps[0].outcomes[0].accepts.high };
	await enter(page, again.reading.toFixed(2));
	readings[odd] = again.reading;
	await expect(page.getByTestId('unexplained-list')).toHaveCount(0);

	// On to a group no probe tells apart.
	let plan = await statelessPlan(page, diagramId, readings);
	for (let i = 0; i < 8 && plan.plan.steps.length; i++) {
		const step = towardGroup(plan.plan.steps);
		expect(step, 'a range of the plan that ends on a group').not.toBeNull();
		await onCard(page, step!.probe);
		await enter(page, step!.reading.toFixed(2));
		readings[step!.probe] = step!.reading;
		plan = await statelessPlan(page, diagramId, readings);
	}
	expect(plan.plan.steps).toEqual([]);
	const left = plan.readings!.remaining.map((r) => plan.suspects.find((s) => s.id === r.suspect)!);
	expect(left.length).toBeGreaterThan(1);
	const job = groupAction(left);
	await expect(page.getByTestId('ambiguous')).toContainText(`No meter reading here can tell these ${left.length} apart`);
	await expect(page.getByTestId('group-job')).toHaveText(job);

	// The printable checklist ends on the same job.
	await page.goto(`${path}/checklist`);
	await expect(page.locator('[data-group-final="yes"]')).toContainText(job);
	await expect(page.locator('[data-step]')).toHaveCount(0);
	await page.goto(path);
	await expect(page.getByTestId('group-job')).toHaveText(job);

	// Conclude: the form offers the group's job as the start of the notes.
	const form = page.getByTestId('conclude-form');
	await expect(form.getByTestId('group-job-suggestion')).toContainText(job);
	await shots(page, testInfo, '3-group');
	await form.getByTestId('use-job').click();
	await expect(form.getByLabel('What you found and did')).toHaveValue(`${job}\n`);
	await form.getByLabel('What you found and did').fill(`${job}\nDone; both gauges read true again.`);
	await form.getByTestId('conclude').click();
	await expect(page.getByTestId('conclusion')).toContainText(job);
	await expect(page.getByTestId('conclusion')).toContainText('both gauges read true again');
	await shots(page, testInfo, '4-concluded');
});

test('a battery read low: charge it first, with the caution; read again once charged', async ({ page }, testInfo) => {
	test.setTimeout(180_000);
	await page.setViewportSize(DESKTOP);
	await signIn(page);
	const diagrams = (await (await page.request.get('/api/diagrams')).json()).diagrams as { id: string; title: string; revision: number }[];
	const diagram = diagrams.find((d) => d.title === 'Complete harness')!;
	const started = await page.request.post(`/api/diagrams/${diagram.id}/diagnoses`, { data: { revision: diagram.revision, marks: OPEN_HUNT.marks, title: 'Gauges low, battery not charged' } });
	expect(started.status(), await started.text()).toBe(201);
	const path = `/diagnoses/${(await started.json()).diagnosis.id}`;
	await page.goto(path);
	const card = page.getByTestId('probe-card');
	await expect(card).toHaveAttribute('data-probe', BATTERY);

	// 11.50 V at rest is below 12.0 V per 12 V: charge first (TRADE.md, BCI rest table; common practice).
	await enter(page, '-11.50');
	const notice = page.getByTestId('charge-battery');
	await expect(notice).toHaveAttribute('role', 'alert');
	await expect(notice).toContainText('Charge the battery first');
	await expect(notice).toContainText('It read \u221211.50 V at its posts');
	await expect(notice).toContainText('below 12.0 V');
	await expect(notice).toContainText('let it rest some hours, then read it again before going on');
	await expect(notice.getByTestId('battery-caution')).toContainText('eye protection');
	await expect(notice.getByTestId('battery-caution')).toContainText('well-ventilated place');
	await expect(page.getByTestId('battery-read')).toHaveCount(0);
	await shots(page, testInfo, '5-charge');

	// The printable checklist says so first.
	await page.goto(`${path}/checklist`);
	await expect(page.locator('[data-charge]')).toContainText('Charge the battery first');
	await page.goto(path);

	// Charged and rested: read it again.
	await notice.getByTestId('battery-again').click();
	await expect(card).toHaveAttribute('data-probe', BATTERY);
	await expect(page.getByRole('heading', { name: 'Take it again' })).toBeVisible();
	await expect(card.getByTestId('reading-input')).toBeVisible({ timeout: 30_000 });
	await enter(page, '-12.45');
	await expect(page.getByTestId('charge-battery')).toHaveCount(0);
	await expect(page.getByTestId('battery-read')).toContainText('\u221212.45 V at its posts');
	await expect(page.getByTestId('battery-read')).toContainText('charged enough to go on');
	await expect(card).not.toHaveAttribute('data-probe', BATTERY);
});
