// E-mail verification, password reset by e-mail, changing a password, and one's own sessions,
// through the built server's forms and the local SMTP catcher. Rules checked come from the
// OWASP Forgot Password Cheat Sheet (single-use, short-lived, hashed URL tokens; sessions ended
// on reset; the same answer whether or not an account exists) and OWASP ASVS 4.0.3 §2.1.5/§3.3.
import { createHash } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import * as accounts from '../../src/lib/server/auth/accounts';
import { db } from '../../src/lib/server/db';
import { emailTokens, sessions, users } from '../../src/lib/server/db/schema';
import { api, cookieFrom, form, get, mailCount, mailTo, pathOf, person, signIn, unique } from './people';

afterAll(async () => {
	await db.$client.end();
});

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

describe('sign-up sends a verification e-mail', () => {
	it('the link confirms the address once', async () => {
		const email = unique('verify');
		const res = await form('/signup', { displayName: 'Vera Fyer', email, password: 'bobbin-coil-lamp-7' });
		expect(res.status).toBe(303);
		const mail = await mailTo(email, /Confirm your e-mail/);
		expect(mail.text).toContain('Hello Vera Fyer');
		expect(mail.html).toContain('<a href=');
		const link = pathOf(mail.links[0]);
		expect(link).toMatch(/^\/verify\/[A-Za-z0-9_-]{43}$/);

		const first = await get(link);
		expect(first.status).toBe(200);
		expect(await first.text()).toContain('is confirmed');
		const [row] = await db.select().from(users).where(eq(users.email, email));
		expect(row.emailVerifiedAt).not.toBeNull();
		// Single use: the second visit finds nothing.
		expect(await (await get(link)).text()).toContain('used already');
	});
});

describe('password reset by e-mail', () => {
	it('works once, within the hour, ends every session, and the old password stops working', async () => {
		const p = await person('Reset Rider');
		const second = await signIn(p.email, p.password);
		expect((await api('GET', '/api/vehicles', p.cookie)).status).toBe(200);

		const ask = await form('/reset', { email: p.email.toUpperCase() });
		expect(ask.status).toBe(200);
		const mail = await mailTo(p.email, /Reset your Loomwright password/);
		const link = pathOf(mail.links[0]);
		const token = link.split('/').pop()!;
		expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);

		// Stored only as its SHA-256, expiring about one hour from now.
		const [row] = await db.select().from(emailTokens).where(eq(emailTokens.userId, p.id));
		expect(row.tokenHash).toBe(sha256(token));
		expect(row.tokenHash).not.toContain(token);
		const hour = row.expiresAt.getTime() - Date.now();
		expect(hour).toBeGreaterThan(59 * 60_000);
		expect(hour).toBeLessThanOrEqual(60 * 60_000);

		expect((await get(link)).status).toBe(200);
		// A weak password is refused and the link stays usable.
		const weak = await form(link, { password: 'password1' });
		expect(weak.status).toBe(400);
		const done = await form(link, { password: 'new-dynamo-brushes-42' }, p.cookie);
		expect(done.status).toBe(303);
		expect(done.headers.get('location')).toBe('/signin?reset=1');

		// Every session of the account is gone, in the database and at the door.
		expect(await db.select().from(sessions).where(eq(sessions.userId, p.id))).toHaveLength(0);
		expect((await api('GET', '/api/vehicles', p.cookie)).status).toBe(401);
		expect((await api('GET', '/api/vehicles', second)).status).toBe(401);

		// Single use.
		const again = await form(link, { password: 'another-dynamo-brush-43' });
		expect(again.status).toBe(400);
		expect(await again.text()).toContain('used already');

		expect((await form('/signin', { email: p.email, password: p.password })).status).toBe(400);
		expect(cookieFrom(await form('/signin', { email: p.email, password: 'new-dynamo-brushes-42' }))).toBeTruthy();
	});

	it('an hour-old link is dead, and an unknown address gets the same answer and no mail', async () => {
		const p = await person('Late Larry');
		await form('/reset', { email: p.email });
		const link = pathOf((await mailTo(p.email, /Reset your/)).links[0]);
		await db.update(emailTokens).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(emailTokens.userId, p.id));
		expect(await (await get(link)).text()).toContain('more than an hour old');
		expect((await form(link, { password: 'new-dynamo-brushes-42' })).status).toBe(400);

		const nobody = unique('nobody');
		const a = await form('/reset', { email: nobody });
		expect(a.status).toBe(200);
		expect(await a.text()).toContain(`If ${nobody} belongs to an account`);
		await new Promise((r) => setTimeout(r, 300));
		expect(await mailCount(nobody)).toBe(0);
	});
});

describe('reset requests per hour', () => {
	it('sends at most three reset e-mails an hour to one account, whatever the form is sent', async () => {
		const p = await person('Flood Target');
		for (let i = 0; i < 5; i++) expect((await form('/reset', { email: p.email })).status).toBe(200);
		await mailTo(p.email, /Reset your/);
		await new Promise((r) => setTimeout(r, 400));
		// The limit is the product's own (links.RESETS_PER_HOUR = 3).
		expect(await mailCount(p.email)).toBe(3);
	});
});

describe('account page', () => {
	it('changes the password only with the current one, and ends the other sessions by default', async () => {
		const p = await person('Change Charlie');
		const other = await signIn(p.email, p.password);
		const page = await get('/account', p.cookie);
		expect(page.status).toBe(200);
		expect(await page.text()).toContain('this session');

		const wrong = await form('/account?/password', { current: 'not-it-at-all', password: 'fresh-tracer-ink-9' }, p.cookie);
		expect(wrong.status).toBe(400);
		expect(await wrong.text()).toContain('not your current password');

		const ok = await form('/account?/password', { current: p.password, password: 'fresh-tracer-ink-9' }, p.cookie);
		expect(ok.status).toBe(200);
		expect(await ok.text()).toContain('1 other session ended');
		expect((await api('GET', '/api/vehicles', other)).status).toBe(401);
		expect((await api('GET', '/api/vehicles', p.cookie)).status).toBe(200);
		expect(await accounts.signIn(p.email, 'fresh-tracer-ink-9', '127.0.0.9')).toMatchObject({ ok: true });
	});

	it('keeps the other sessions after a password change only when asked to', async () => {
		const p = await person('Keeping Kim');
		const other = await signIn(p.email, p.password);
		const ok = await form('/account?/password', { current: p.password, password: 'dwell-angle-gauge-4', keepOthers: 'on' }, p.cookie);
		expect(ok.status).toBe(200);
		expect(await ok.text()).toContain('Password changed.');
		expect((await api('GET', '/api/vehicles', other)).status).toBe(200);
	});

	it('lists own sessions and ends one by its handle; a handle of another account does nothing', async () => {
		const p = await person('Session Sam');
		const other = await signIn(p.email, p.password);
		const html = await (await get('/account', p.cookie)).text();
		const handles = [...html.matchAll(/name="handle" value="([0-9a-f]{24})"/g)].map((m) => m[1]);
		expect(handles).toHaveLength(1);

		const stranger = await person('Stranger Sue');
		expect((await form('/account?/endSession', { handle: handles[0] }, stranger.cookie)).status).toBe(404);
		expect((await api('GET', '/api/vehicles', other)).status).toBe(200);

		expect((await form('/account?/endSession', { handle: handles[0] }, p.cookie)).status).toBe(200);
		expect((await api('GET', '/api/vehicles', other)).status).toBe(401);
		expect((await api('GET', '/api/vehicles', p.cookie)).status).toBe(200);
	});
});

describe('caught mail page', () => {
	it('shows caught mail to a site admin and to nobody else', async () => {
		const admin = await person('Mail Admin', 'admin');
		const p = await person('Mail Reader');
		await form('/reset', { email: p.email });
		await mailTo(p.email, /Reset your/);
		const page = await get('/admin/mail', admin.cookie);
		expect(page.status).toBe(200);
		const html = await page.text();
		expect(html).toContain('Reset your Loomwright password');
		expect(html).toContain(p.email);
		expect((await get('/admin/mail', p.cookie)).status).toBe(404);
		expect((await get('/admin/mail')).status).toBe(404);
	});
});
