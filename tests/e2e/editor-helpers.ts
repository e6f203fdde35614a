// Shared steps for the drawing board's end-to-end tests.
import { expect, type APIRequestContext, type Page } from '@playwright/test';

export const DEMO = { email: 'demo@loomwright.test', password: 'tracer-stripe-demo' };

export async function signIn(page: Page): Promise<void> {
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(DEMO.email);
	await page.getByLabel('Password').fill(DEMO.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL((url) => !url.pathname.startsWith('/signin'));
}

/** A fresh diagram on the demo vehicle, so each test starts from a known document. */
export async function newDiagram(request: APIRequestContext, title: string, document?: unknown): Promise<string> {
	const vehicles = await request.get('/api/vehicles');
	expect(vehicles.ok()).toBe(true);
	const vehicleId = (await vehicles.json()).vehicles[0].id as string;
	const created = await request.post('/api/diagrams', { data: { vehicleId, title, ...(document ? { document } : {}) } });
	expect(created.status(), await created.text()).toBe(201);
	return (await created.json()).diagram.id as string;
}

export async function documentOf(request: APIRequestContext, id: string) {
	const r = await request.get(`/api/diagrams/${id}`);
	expect(r.ok()).toBe(true);
	return (await r.json()).diagram as { revision: number; document: { parts: { id: string; kind: string; key: string }[]; wires: { code: string; from: unknown; to: unknown }[] } };
}

/** Drags with the mouse in small steps, as a hand would (the canvas needs the moves in between). */
export async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }): Promise<void> {
	await page.mouse.move(from.x, from.y);
	await page.mouse.down();
	for (let i = 1; i <= 12; i++) await page.mouse.move(from.x + ((to.x - from.x) * i) / 12, from.y + ((to.y - from.y) * i) / 12);
	await page.mouse.up();
}

export async function centreOf(page: Page, selector: string) {
	const box = await page.locator(selector).boundingBox();
	if (!box) throw new Error(`no box for ${selector}`);
	return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

export async function waitSaved(page: Page): Promise<void> {
	await expect(page.locator('[data-save-state]')).toHaveAttribute('data-save-state', 'saved', { timeout: 15_000 });
}

/** An invented three-part loom (panel switch, lamp, dash earth) with a G/B feed and a B earth wire. */
export function panelLampLoom(earth: 'negative' | 'positive') {
	return {
		schemaVersion: 1,
		vehicle: { systemVoltage: 12, earth },
		palette: 'trade-letters',
		parts: [
			{ id: 'sw', key: '7', label: 'Panel switch', kind: 'switch', terminals: ['1', '2'], params: { positions: [{ name: 'off', closed: [] }, { name: 'on', closed: [['1', '2']] }] }, position: { x: 0, y: 0 } },
			{ id: 'lamp', key: '12', label: 'Panel lamp', kind: 'lamp', position: { x: 320, y: 60 } },
			{ id: 'earth', key: '3', label: 'Dash earth', kind: 'earth-point', position: { x: 560, y: 200 } }
		],
		wires: [
			{ id: 'w1', from: { part: 'sw', terminal: '2' }, to: { part: 'lamp', terminal: 'feed' }, code: 'G/B', size: { mm2: 1 }, lengthM: 0.8 },
			{ id: 'w2', from: { part: 'lamp', terminal: 'earth' }, to: { part: 'earth', terminal: 'stud' }, code: 'B', size: { mm2: 1 }, lengthM: 0.3 }
		]
	};
}
