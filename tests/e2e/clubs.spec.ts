// A club evening: an organiser starts a club, invites a member by e-mail and shares a diagram
// with the club; the member accepts from the caught invitation mail, opens the diagram
// read-only, copies it to their own garage and corrects a wire code in the copy; the original
// stays as it was, and the owner's comment notification is caught. Accounts are made here with
// unique addresses, so the spec depends on no other. The loom is the invented panel-lamp one.
import { expect, test, type Page } from '@playwright/test';
import { panelLampLoom, signIn, waitSaved } from './editor-helpers';

const MAIL = `http://127.0.0.1:${process.env.MAIL_API_PORT ?? 2626}/messages`;
const unique = (name: string) => `${name}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@example.test`;

const loom = panelLampLoom('positive');

async function signUp(page: Page, displayName: string, email: string, password: string) {
	await page.goto('/signup');
	await page.getByLabel('Your name').fill(displayName);
	await page.getByLabel('E-mail address').fill(email);
	await page.getByLabel('Password', { exact: true }).fill(password);
	await page.getByRole('button', { name: 'Create account' }).click();
	await expect(page).toHaveURL(/\/garage$/);
}

/** The newest caught message to `to` whose subject matches, with its plain-text body decoded. */
async function caughtMail(to: string, subject: RegExp): Promise<{ subject: string; text: string }> {
	let found: { subject: string; text: string } | undefined;
	await expect
		.poll(
			async () => {
				const all = (await (await fetch(MAIL)).json()) as { to: string[]; raw: string }[];
				const { readMessage } = await import('../../src/lib/server/mail-read');
				found = all
					.filter((m) => m.to.includes(to))
					.map((m) => readMessage(m.raw))
					.filter((m) => subject.test(m.subject))
					.at(-1);
				return Boolean(found);
			},
			{ timeout: 15_000 }
		)
		.toBe(true);
	return found!;
}

test('organiser invites, member accepts, copies the shared diagram and corrects the copy; owner hears of the comment', async ({ page, browser }) => {
	const organiserEmail = unique('organiser');
	const memberEmail = unique('member');

	// The organiser, their vehicle and a diagram.
	await signUp(page, 'Olive Organiser', organiserEmail, 'magneto-bench-evening');
	const v = await page.request.post('/api/vehicles', {
		data: { name: 'Club tourer', make: 'Ombrith & Vessick', model: 'Ostrimmel Tourer', year: '1962', systemVoltage: 12, earthPolarity: 'positive' }
	});
	expect(v.status()).toBe(201);
	const d = await page.request.post('/api/diagrams', { data: { vehicleId: (await v.json()).vehicle.id, title: 'Panel lamps', document: loom } });
	expect(d.status()).toBe(201);
	const originalId = (await d.json()).diagram.id as string;

	// A club, an invitation.
	await page.getByRole('link', { name: 'Clubs' }).click();
	await page.getByLabel('Club name').fill('Ostrimmel Register');
	await page.getByLabel('Description').fill('Owners of Ostrimmel tourers, first Thursday of the month.');
	await page.getByRole('button', { name: 'Start the club' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Ostrimmel Register' })).toBeVisible();
	await page.getByLabel('Their e-mail address').fill(memberEmail);
	await page.getByRole('button', { name: 'Send invitation' }).click();
	await expect(page.getByText(`Invitation sent to ${memberEmail}`)).toBeVisible();
	await page.screenshot({ path: '.data/test/e2e-club.png', fullPage: true });

	// Share the diagram with the club, at comment level (members may comment, not change it).
	await page.goto(`/diagrams/${originalId}/share`);
	const clubShare = page.getByRole('region', { name: 'Share with a club' });
	await clubShare.getByLabel('Level').selectOption('comment');
	await clubShare.getByRole('button', { name: 'Share with the club' }).click();
	await expect(page.getByText('Shared with the club Ostrimmel Register')).toBeVisible();
	await page.screenshot({ path: '.data/test/e2e-share.png', fullPage: true });

	// The invitation is caught; the member follows its link.
	const invitation = await caughtMail(memberEmail, /Olive Organiser invites you to Ostrimmel Register/);
	const link = invitation.text.match(/https?:\/\/\S+\/invitations\/[A-Za-z0-9_-]{43}/)![0];
	const member = await (await browser.newContext()).newPage();
	await signUp(member, 'Mel Member', memberEmail, 'tracer-lamp-thursday');
	await member.goto(new URL(link).pathname);
	await expect(member.getByRole('heading', { level: 1, name: 'Ostrimmel Register' })).toBeVisible();
	await member.getByRole('button', { name: 'Accept and join' }).click();
	await expect(member.getByRole('heading', { name: /Members \(2\)/ })).toBeVisible();

	// The club library lists it; search by model finds it.
	await member.getByLabel('Model').fill('ostrimmel');
	await member.getByRole('button', { name: 'Search' }).click();
	const shared = member.getByRole('list', { name: 'Shared diagrams' });
	await expect(shared.getByRole('link', { name: 'Panel lamps' })).toBeVisible();
	await shared.getByRole('link', { name: 'Panel lamps' }).click();

	// Read-only for the member: no rename, no delete; the API refuses a save.
	await expect(member.getByRole('heading', { level: 1, name: 'Panel lamps' })).toBeVisible();
	await expect(member.getByText('shared with you: you may comment')).toBeVisible();
	await expect(member.getByRole('button', { name: 'Rename' })).toHaveCount(0);
	await expect(member.getByText('Delete this diagram…')).toHaveCount(0);
	const refused = await member.request.put(`/api/diagrams/${originalId}`, { data: { revision: 1, document: loom } });
	expect(refused.status()).toBe(403);

	// Copy to the member's garage.
	await member.getByRole('link', { name: 'Copy to my garage' }).click();
	await member.getByLabel('Name of the new vehicle').fill('My Ostrimmel');
	await member.getByRole('button', { name: 'Make my copy' }).click();
	await expect(member.getByTestId('based-on')).toHaveText('Based on “Panel lamps” by Olive Organiser, revision 1');
	const copyId = new URL(member.url()).pathname.split('/').pop()!;
	expect(copyId).not.toBe(originalId);

	// Correct the copy on the drawing board: the feed wire is R/W on this vehicle.
	await member.getByRole('link', { name: 'Open the drawing board' }).click();
	await member.getByRole('button', { name: 'Wire list' }).click();
	const cell = member.getByRole('table', { name: 'Wire list' }).getByRole('combobox', { name: 'Code of wire G/B from 7 2 to 12 feed' });
	await cell.fill('r/w');
	await cell.press('Enter');
	await expect(member.locator('[data-wire-id="w1"]')).toHaveAttribute('data-code', 'R/W');
	await waitSaved(member);
	const copy = (await (await member.request.get(`/api/diagrams/${copyId}`)).json()).diagram;
	expect(copy.revision).toBe(2);
	expect(copy.document.wires.map((w: { code: string }) => w.code)).toEqual(['R/W', 'B']);

	// The original is unchanged.
	const original = (await (await page.request.get(`/api/diagrams/${originalId}`)).json()).diagram;
	expect(original.revision).toBe(1);
	expect(original.title).toBe('Panel lamps');
	expect(original.document.wires.map((w: { code: string }) => w.code)).toEqual(['G/B', 'B']);

	// The member comments on the original's lamp; the owner's notification is caught.
	await member.goto(`/diagrams/${originalId}/comments`);
	await member.getByLabel('About').selectOption({ label: '12 Panel lamp' });
	await member.getByLabel('Comment', { exact: true }).fill('On my Ostrimmel the feed to the panel lamp is red with a white tracer.');
	await member.getByRole('button', { name: 'Post comment' }).click();
	await expect(member.getByTestId('comment')).toContainText('red with a white tracer');
	await expect(member.getByTestId('comment')).toContainText('Part 12 Panel lamp');
	await member.screenshot({ path: '.data/test/e2e-comments.png', fullPage: true });

	const notice = await caughtMail(organiserEmail, /Mel Member commented on “Panel lamps”/);
	expect(notice.text).toContain('the part 12 Panel lamp');
	expect(notice.text).toContain('red with a white tracer');
	await member.context().close();
});

test('the demo restorer is a member of the demo club, whose library holds the organiser’s checked harness', async ({ page }) => {
	await signIn(page);
	await page.goto('/clubs');
	await page.getByRole('link', { name: 'Ostrimmel Tourer Register' }).click();
	await expect(page.getByText('You are a member.')).toBeVisible();
	const shared = page.getByRole('list', { name: 'Shared diagrams' });
	await expect(shared.getByRole('link', { name: 'Complete harness' })).toBeVisible();
	await shared.getByRole('link', { name: 'Register harness, checked wire by wire' }).click();
	await expect(page.getByText('shared with you: read-only')).toBeVisible();
	await expect(page.getByRole('link', { name: 'Copy to my garage' })).toBeVisible();
	await expect(page.getByRole('button', { name: 'Rename' })).toHaveCount(0);
	// The same diagram on the page of what is shared with the demo restorer.
	await page.goto('/shared');
	await expect(page.getByRole('link', { name: 'Register harness, checked wire by wire' })).toBeVisible();
	await expect(page.getByText('through Ostrimmel Tourer Register')).toBeVisible();
});
