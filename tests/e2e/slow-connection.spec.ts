import { expect, test } from '@playwright/test';
import { DEMO } from './editor-helpers';

// On a slow connection the sign-in form is on screen before the page's script has arrived; what
// a person types then must still be there when the script takes over the page.
test('an e-mail address typed before the page’s script arrives is kept, and signing in works', async ({ page }) => {
	// Every script of the app held back 1.5 s, as on a slow phone connection.
	await page.route('**/_app/immutable/**/*.js', async (route) => {
		await new Promise((r) => setTimeout(r, 1500));
		await route.continue();
	});
	await page.goto('/signin', { waitUntil: 'commit' });
	const email = page.getByLabel('E-mail address');
	await email.fill(DEMO.email);
	// The held-back scripts arrive (no request left for half a second) and take over the page.
	await page.waitForLoadState('networkidle');
	await page.waitForTimeout(500);
	await expect(email).toHaveValue(DEMO.email);
	await page.getByLabel('Password').fill(DEMO.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL((u) => !u.pathname.startsWith('/signin'));
});
