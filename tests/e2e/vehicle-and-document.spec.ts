// Looking after a vehicle and its diagram from the pages: edit details, load a document file
// (refused with the field path when it is wrong), download it again, delete.
import { expect, test } from '@playwright/test';

const email = `keeper-${Date.now().toString(36)}@example.test`;

test('edit a vehicle, load and download a document, delete the vehicle', async ({ page }) => {
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Ivy Keeper');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password', { exact: true }).fill('overdrive-kickdown-switch');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/garage$/);

	await page.getByLabel('Name').fill('Project van');
	await page.getByRole('button', { name: 'Add to garage' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Project van' })).toBeVisible();

	// Edit details: a 24 V conversion, renamed.
	const details = page.getByRole('region', { name: 'Vehicle details' });
	await details.getByLabel('Name').fill('Project van (24 V)');
	await details.getByLabel('24 V').check();
	await details.getByRole('button', { name: 'Save details' }).click();
	await expect(details.getByText('Saved.')).toBeVisible();
	await expect(page.getByRole('heading', { level: 1, name: 'Project van (24 V)' })).toBeVisible();
	await expect(page.getByText('· 24 V ·')).toBeVisible();

	await page.getByLabel('New diagram').fill('Starting');
	await page.getByRole('button', { name: 'Start diagram' }).click();
	await expect(page.getByText('24 V · Negative earth')).toBeVisible();

	// A file whose parts are not a list: refused, naming the path; nothing saved.
	const input = page.locator('input[type=file]');
	const bad = { schemaVersion: 1, vehicle: { systemVoltage: 24, earth: 'negative' }, parts: 'battery', wires: [] };
	await input.setInputFiles({ name: 'bad.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
	await expect(page.getByRole('alert')).toContainText('The document has problems.');
	await expect(page.getByRole('alert')).toContainText('document.parts');
	await expect(page.getByText('Revision 1', { exact: true }).first()).toBeVisible();

	// A good one: one lamp. Saved as revision 2.
	const good = { schemaVersion: 1, vehicle: { systemVoltage: 24, earth: 'negative' }, parts: [{ id: 'lamp1', key: '7', kind: 'lamp', label: 'Cab lamp' }], wires: [] };
	await input.setInputFiles({ name: 'good.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(good)) });
	await expect(page.getByRole('status').filter({ hasText: 'Loaded good.json as revision 2.' })).toBeVisible();
	await expect(page.getByTestId('parts-count')).toHaveText('1');
	await expect(page.getByText('Revision 2', { exact: true }).first()).toBeVisible();

	const downloading = page.waitForEvent('download');
	await page.getByRole('button', { name: 'Download revision 2' }).click();
	const download = await downloading;
	expect(download.suggestedFilename()).toBe('Starting-r2.json');
	const text = await (await download.createReadStream()).toArray();
	const saved = JSON.parse(Buffer.concat(text).toString('utf8'));
	expect(saved.parts[0]).toMatchObject({ id: 'lamp1', key: '7', kind: 'lamp', label: 'Cab lamp' });

	// Delete the vehicle: back to an empty garage.
	await page.getByRole('navigation', { name: 'Breadcrumb' }).getByRole('link', { name: 'Project van (24 V)' }).click();
	await page.getByText('Delete this vehicle…').click();
	await page.getByRole('button', { name: 'Delete Project van (24 V)' }).click();
	await expect(page).toHaveURL(/\/garage$/);
	await expect(page.getByText('Nothing parked here yet.')).toBeVisible();
});
