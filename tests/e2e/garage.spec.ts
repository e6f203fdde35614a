// A restorer's first evening: sign up, add a vehicle and a diagram, sign out; another account
// cannot see them. Runs in Debian's chromium against the built server and a seeded database.
import { expect, test, type Page } from '@playwright/test';

const unique = (name: string) => `${name}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@example.test`;

async function signUp(page: Page, displayName: string, email: string, password: string) {
	await page.goto('/signup');
	await page.getByLabel('Your name').fill(displayName);
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/garage$/);
}

test('sign up, add a vehicle and a diagram, sign out; another account gets 404', async ({ page }) => {
	const email = unique('owner');
	await signUp(page, 'Maud Fettle', email, 'bakelite-distributor-cap');
	await expect(page.getByRole('heading', { name: 'Your garage' })).toBeVisible();
	await expect(page.getByText('Nothing parked here yet.')).toBeVisible();

	await page.getByLabel('Name').fill('Old Bess');
	await page.getByLabel('Make').fill('Corvell');
	await page.getByLabel('Model').fill('Stanway Six');
	await page.getByLabel('Year').fill('1954');
	await page.getByLabel('6 V').check();
	await page.getByLabel(/Positive earth/).check();
	await page.getByRole('button', { name: 'Add to garage' }).click();

	await expect(page.getByRole('heading', { level: 1, name: 'Old Bess' })).toBeVisible();
	await expect(page.getByText('1954 Corvell Stanway Six · 6 V · positive earth')).toBeVisible();
	const vehicleUrl = page.url();

	await page.getByLabel('New diagram').fill('Lighting and horn');
	await page.getByRole('button', { name: 'Start diagram' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Lighting and horn' })).toBeVisible();
	await expect(page.getByText('Revision 1', { exact: true }).first()).toBeVisible();
	await expect(page.getByTestId('parts-count')).toHaveText('0');
	await expect(page.getByTestId('wires-count')).toHaveText('0');
	// The new document took the vehicle's facts.
	await expect(page.getByText('6 V · Positive earth')).toBeVisible();
	const diagramUrl = page.url();

	// Rename it.
	await page.getByRole('button', { name: 'Rename' }).click();
	await page.getByLabel('Title').fill('Lighting, horn and indicators');
	await page.getByRole('button', { name: 'Save title' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Lighting, horn and indicators' })).toBeVisible();

	await page.getByRole('button', { name: 'Sign out' }).click();
	await expect(page).toHaveURL(/\/$/);
	await expect(page.getByRole('link', { name: 'Sign in' }).first()).toBeVisible();

	// Signed out, the diagram sends you to sign in.
	await page.goto(diagramUrl);
	await expect(page).toHaveURL(/\/signin\?next=/);

	await signUp(page, 'Someone Else', unique('other'), 'trafficator-flasher-unit');
	for (const url of [diagramUrl, vehicleUrl]) {
		const response = await page.goto(url);
		expect(response?.status()).toBe(404);
		await expect(page.getByRole('heading', { name: 'Nothing on this terminal' })).toBeVisible();
		await expect(page.getByText('Old Bess')).toHaveCount(0);
	}
	await page.goto('/garage');
	await expect(page.getByText('Nothing parked here yet.')).toBeVisible();
});

test('the demo account signs in and finds its invented vehicle', async ({ page }) => {
	await page.goto('/');
	await page.getByRole('link', { name: 'Sign in' }).first().click();
	await page.getByLabel('E-mail address').fill('demo@loomwright.test');
	await page.getByLabel('Password').fill('tracer-stripe-demo');
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/garage$/);
	await page.getByRole('link', { name: /The Ostrimmel/ }).click();
	await expect(page.getByText('1962 Ombrith & Vessick Ostrimmel Tourer · 12 V · positive earth')).toBeVisible();
	await page.getByRole('link', { name: /Complete harness/ }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Complete harness' })).toBeVisible();
});

test('a bad form shows its errors beside the fields', async ({ page }) => {
	// Sign-up: a password from the common-password list.
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Quick Typist');
	await page.getByLabel('E-mail address').fill('not-an-address');
	await page.getByLabel('Password', { exact: true }).fill('password1');
	await page.getByRole('button', { name: 'Create account' }).click();
	const emailInput = page.getByLabel('E-mail address');
	await expect(emailInput).toHaveAttribute('aria-invalid', 'true');
	await expect(page.locator('#field-email-error')).toHaveText(/Enter an e-mail address like/);
	await expect(emailInput).toHaveAttribute('aria-describedby', /field-email-error/);
	// The name typed is kept.
	await expect(page.getByLabel('Your name')).toHaveValue('Quick Typist');

	await page.getByLabel('E-mail address').fill(unique('typist'));
	await page.getByLabel('Password', { exact: true }).fill('password1');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page.locator('#field-password-error')).toHaveText(/list of common passwords/);
	await expect(page.getByLabel('Password', { exact: true })).toHaveAttribute('aria-describedby', /field-password-error/);

	// Garage: a vehicle with no name.
	await page.getByLabel('Password', { exact: true }).fill('gearbox-overdrive-solenoid');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/garage$/);
	await page.getByRole('button', { name: 'Add to garage' }).click();
	await expect(page.getByRole('alert')).toContainText('Some fields need fixing');
	await expect(page.locator('#new-vehicle-name-error')).toHaveText(/Name is required/);
	await expect(page.getByLabel('Name')).toHaveAttribute('aria-invalid', 'true');
});
