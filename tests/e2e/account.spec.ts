// Forgotten password by the caught e-mail, in the browser: the link works once and every open
// session ends (OWASP Forgot Password Cheat Sheet). Then the account page's session list and the
// admin's caught-mail page. Accounts are made here with unique addresses.
import { expect, test, type Page } from '@playwright/test';

const MAIL = `http://127.0.0.1:${process.env.MAIL_API_PORT ?? 2626}/messages`;
const unique = (name: string) => `${name}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@example.test`;

async function signIn(page: Page, email: string, password: string) {
	await page.goto('/signin');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password').fill(password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await expect(page).toHaveURL(/\/garage$/);
}

async function resetLink(to: string): Promise<string> {
	const { readMessage } = await import('../../src/lib/server/mail-read');
	let link = '';
	await expect
		.poll(async () => {
			const all = (await (await fetch(MAIL)).json()) as { to: string[]; raw: string }[];
			const text = all.filter((m) => m.to.includes(to)).map((m) => readMessage(m.raw)).filter((m) => /Reset your/.test(m.subject)).at(-1)?.text ?? '';
			link = text.match(/https?:\/\/\S+\/reset\/[A-Za-z0-9_-]{43}/)?.[0] ?? '';
			return link;
		}, { timeout: 15_000 })
		.not.toBe('');
	return new URL(link).pathname;
}

test('reset a forgotten password by the caught e-mail: once only, and every session ends', async ({ page, browser }) => {
	const email = unique('forgetful');
	await page.goto('/signup');
	await page.getByLabel('Your name').fill('Fen Forgetful');
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password', { exact: true }).fill('first-dynamo-password');
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/garage$/);

	// A second session, on "another device".
	const phone = await (await browser.newContext()).newPage();
	await signIn(phone, email, 'first-dynamo-password');
	await page.getByRole('link', { name: 'Fen Forgetful' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Your account' })).toBeVisible();
	await expect(page.getByTestId('sessions').locator('li')).toHaveCount(2);
	await page.screenshot({ path: '.data/test/e2e-account.png', fullPage: true });

	// Someone without a session asks for the link.
	const desk = await (await browser.newContext()).newPage();
	await desk.goto('/signin');
	await desk.getByRole('link', { name: 'Forgotten your password?' }).click();
	await desk.getByLabel('E-mail address').fill(email);
	await desk.getByRole('button', { name: 'Send me a reset link' }).click();
	await expect(desk.getByText(`If ${email} belongs to an account`)).toBeVisible();

	const link = await resetLink(email);
	await desk.goto(link);
	await desk.getByLabel('New password').fill('second-magneto-password');
	await desk.getByRole('button', { name: 'Set the new password' }).click();
	await expect(desk.getByText('Your new password is set and every session was ended')).toBeVisible();

	// Both old sessions are gone.
	for (const p of [page, phone]) {
		await p.goto('/garage');
		await expect(p).toHaveURL(/\/signin\?next=/);
	}
	// The link works once.
	await desk.goto(link);
	await expect(desk.getByText('used already or is more than an hour old')).toBeVisible();

	await signIn(desk, email, 'second-magneto-password');

	// The site admin sees the caught message.
	const admin = await (await browser.newContext()).newPage();
	await signIn(admin, 'admin@loomwright.test', 'earth-strap-admin');
	await admin.getByRole('link', { name: 'Caught mail' }).click();
	await expect(admin.getByRole('heading', { level: 1, name: 'Caught mail' })).toBeVisible();
	await expect(admin.getByText(`to ${email}`).first()).toBeVisible();
	await admin.screenshot({ path: '.data/test/e2e-caught-mail.png', fullPage: true });
	for (const p of [phone, desk, admin]) await p.context().close();
});
