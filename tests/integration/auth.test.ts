// Sign-up, sign-in, sessions, sign-out, throttling and disabled accounts, through the built
// server's HTML form actions (no JavaScript: the progressive-enhancement path).
import { eq, like } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import * as accounts from '../../src/lib/server/auth/accounts';
import { db } from '../../src/lib/server/db';
import { sessions, signInThrottle, users } from '../../src/lib/server/db/schema';
import { baseUrl } from './helpers';

const COOKIE = '__Host-loomwright_session';
const unique = (name: string) => `${name}-${crypto.randomUUID().slice(0, 8)}@example.test`;

function form(path: string, fields: Record<string, string>, cookie?: string, origin = baseUrl()) {
	return fetch(baseUrl() + path, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin,
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded',
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(fields)
	});
}

function get(path: string, cookie?: string) {
	return fetch(baseUrl() + path, { redirect: 'manual', headers: { accept: 'text/html', ...(cookie ? { cookie } : {}) } });
}

/** The session cookie a response sets, as "name=value", and its raw Set-Cookie line. */
function sessionCookie(res: Response): { pair: string; line: string } | null {
	const line = res.headers.getSetCookie().find((c) => c.startsWith(`${COOKIE}=`));
	return line ? { pair: line.split(';')[0], line } : null;
}

async function signIn(email: string, password: string) {
	const res = await form('/signin', { email, password });
	expect(res.status).toBe(303);
	return sessionCookie(res)!.pair;
}

afterAll(async () => {
	await db.$client.end();
});

describe('sign-up, sign-in and the session cookie', () => {
	it('signs up, signs in again with a new session id, and the cookie opens the garage', async () => {
		const email = unique('Ann.Restorer');
		const res = await form('/signup', { displayName: 'Ann Restorer', email, password: 'magneto-points-gap' });
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/garage');
		const first = sessionCookie(res)!;
		// OWASP ASVS 4.0.3 §3.4.1–3.4.4: Secure, HttpOnly, SameSite and the __Host- prefix (no Domain, Path=/).
		expect(first.line).toMatch(/; HttpOnly/i);
		expect(first.line).toMatch(/; Secure/i);
		expect(first.line).toMatch(/; SameSite=Lax/i);
		expect(first.line).toMatch(/; Path=\//i);
		expect(first.line).not.toMatch(/Domain=/i);
		// e-mail is stored lower-cased
		const [row] = await db.select().from(users).where(eq(users.email, email.toLowerCase()));
		expect(row.displayName).toBe('Ann Restorer');
		expect(row.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);

		const garage = await get('/garage', first.pair);
		expect(garage.status).toBe(200);
		expect(await garage.text()).toContain('Ann Restorer');

		// Signing in (with mixed case, as typed) while carrying the old cookie: a fresh session id
		// and the old session ended (ASVS §3.2.1).
		const again = await form('/signin', { email: email.toUpperCase(), password: 'magneto-points-gap', next: '/garage' }, first.pair);
		expect(again.status).toBe(303);
		const second = sessionCookie(again)!;
		expect(second.pair).not.toBe(first.pair);
		expect((await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie: first.pair } })).status).toBe(401);
		expect((await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie: second.pair } })).status).toBe(200);
	});

	it('sends a signed-out visitor of a garage page to sign-in, with the way back', async () => {
		const res = await get('/garage');
		expect(res.status).toBe(303);
		expect(res.headers.get('location')).toBe('/signin?next=%2Fgarage');
	});

	it('refuses an e-mail address that already has an account, naming the field', async () => {
		const email = unique('dup');
		await accounts.createAccount({ email, displayName: 'First', password: 'dynamo-field-coil' });
		const res = await form('/signup', { displayName: 'Second', email, password: 'dynamo-field-coil' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('An account with this e-mail address already exists');
	});

	it('refuses a password from the common-password list and creates no account', async () => {
		const email = unique('common');
		// "password1" is in zxcvbn-ts's passwords-common list (OWASP ASVS 4.0.3 §2.1.7).
		const res = await form('/signup', { displayName: 'Common', email, password: 'password1' });
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(html).toContain('on the list of common passwords');
		expect(html).toMatch(/aria-describedby="[^"]*field-password-error/);
		expect(await db.select().from(users).where(eq(users.email, email))).toHaveLength(0);
	});

	it('refuses a 7-character password and one over 128 (ASVS §2.1.2)', async () => {
		const short = await form('/signup', { displayName: 'Short', email: unique('short'), password: 'bx7#Lq2' });
		expect(short.status).toBe(400);
		expect(await short.text()).toContain('Use at least 8 characters');
		const long = await form('/signup', { displayName: 'Long', email: unique('long'), password: 'w'.repeat(129) });
		expect(long.status).toBe(400);
		expect(await long.text()).toContain('Use at most 128 characters');
	});
});

describe('sliding expiry', () => {
	it('a session used in the second half of its 30 days is extended and its cookie sent again', async () => {
		const email = unique('slide');
		await accounts.createAccount({ email, displayName: 'Regular', password: 'tachometer-drive-cable' });
		const cookie = await signIn(email, 'tachometer-drive-cable');
		const id = cookie.split('=')[1];
		const tenDays = new Date(Date.now() + 10 * 24 * 3600 * 1000);
		await db.update(sessions).set({ expiresAt: tenDays }).where(eq(sessions.id, id));

		const res = await get('/garage', cookie);
		expect(res.status).toBe(200);
		// lucia 3 extends a session with less than half its lifetime left (lucia docs, "Session lifetime").
		const refreshed = sessionCookie(res)!;
		expect(refreshed.pair).toBe(cookie);
		expect(refreshed.line).toMatch(/Max-Age=2592000/);
		const [row] = await db.select().from(sessions).where(eq(sessions.id, id));
		expect(row.expiresAt.getTime()).toBeGreaterThan(Date.now() + 29 * 24 * 3600 * 1000);

		// A session with most of its life left is not re-sent on every request.
		expect(sessionCookie(await get('/garage', cookie))).toBeNull();
	});
});

describe('sign-out', () => {
	it('ends the session on the server, only by POST, and only from this site', async () => {
		const email = unique('signout');
		await accounts.createAccount({ email, displayName: 'Leaving', password: 'headlamp-dip-relay' });
		const cookie = await signIn(email, 'headlamp-dip-relay');
		const user = (await accounts.findByEmail(email))!;

		// A GET shows the page and changes nothing.
		expect((await get('/signout', cookie)).status).toBe(200);
		expect(await db.select().from(sessions).where(eq(sessions.userId, user.id))).toHaveLength(1);

		// SvelteKit's origin check refuses a form posted from another site (CSRF).
		const forged = await form('/signout', {}, cookie, 'http://elsewhere.test');
		expect(forged.status).toBe(403);
		expect(await db.select().from(sessions).where(eq(sessions.userId, user.id))).toHaveLength(1);

		const res = await form('/signout', {}, cookie);
		expect(res.status).toBe(303);
		expect(sessionCookie(res)!.line).toMatch(/Max-Age=0/i);
		expect(await db.select().from(sessions).where(eq(sessions.userId, user.id))).toHaveLength(0);
		// The old cookie, replayed, is worth nothing (ASVS §3.3.1).
		expect((await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie } })).status).toBe(401);
	});
});

describe('sign-in throttling', () => {
	it('after 5 failures asks the person to wait, even with the right password, and counts in PostgreSQL', async () => {
		const email = unique('throttle');
		await accounts.createAccount({ email, displayName: 'Forgetful', password: 'fuel-sender-float' });
		for (let i = 1; i <= 5; i++) {
			const res = await form('/signin', { email, password: `wrong-guess-${i}` });
			expect(res.status).toBe(400);
			expect(await res.text()).toContain('do not match an account');
		}
		const [row] = await db.select().from(signInThrottle).where(eq(signInThrottle.key, `account:${email}`));
		expect(row.failures).toBe(5);

		// The 5th failure sets a 30 s wait (throttle-schedule.ts, worked in its unit test).
		const blocked = await form('/signin', { email, password: 'fuel-sender-float' });
		expect(blocked.status).toBe(429);
		const html = await blocked.text();
		expect(html).toContain('Too many failed sign-ins');
		expect(html).toMatch(/wait (2\d|30) seconds/);
		expect(sessionCookie(blocked)).toBeNull();
	});

	it('counts failures for an address with no account the same way (no account enumeration)', async () => {
		const email = unique('nobody');
		const res = await form('/signin', { email, password: 'anything-at-all' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('do not match an account');
		const [row] = await db.select().from(signInThrottle).where(eq(signInThrottle.key, `account:${email}`));
		expect(row.failures).toBe(1);
	});

	it('starts the account’s count again after a successful sign-in and clears stale rows', async () => {
		const email = unique('recovers');
		const created = await accounts.createAccount({ email, displayName: 'Recovers', password: 'coil-ballast-wire' });
		if (!created.ok) throw new Error(created.message);
		const twoDaysAgo = new Date(Date.now() - 2 * 24 * 3600 * 1000);
		const staleKey = `address:stale-${crypto.randomUUID()}`;
		await db.insert(signInThrottle).values({ key: staleKey, failures: 3, windowStartedAt: twoDaysAgo, lastFailureAt: twoDaysAgo });
		const expiredId = `expired-${crypto.randomUUID()}`;
		await db.insert(sessions).values({ id: expiredId, userId: created.user.id, expiresAt: twoDaysAgo });

		await form('/signin', { email, password: 'not-it' });
		await signIn(email, 'coil-ballast-wire');
		expect(await db.select().from(signInThrottle).where(like(signInThrottle.key, `account:${email}`))).toHaveLength(0);
		expect(await db.select().from(signInThrottle).where(eq(signInThrottle.key, staleKey))).toHaveLength(0);
		expect(await db.select().from(sessions).where(eq(sessions.id, expiredId))).toHaveLength(0);
	});
});

describe('site admin and disabled accounts', () => {
	it('disabling an account ends its sessions at once and stops it signing in', async () => {
		const adminEmail = unique('admin');
		await accounts.createAccount({ email: adminEmail, displayName: 'Club Admin', password: 'earth-braid-strap', role: 'admin' });
		const memberEmail = unique('member');
		const created = await accounts.createAccount({ email: memberEmail, displayName: 'Member', password: 'wiper-park-switch' });
		if (!created.ok) throw new Error(created.message);
		const member = created.user;

		const adminCookie = await signIn(adminEmail, 'earth-braid-strap');
		const memberCookie = await signIn(memberEmail, 'wiper-park-switch');
		expect((await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie: memberCookie } })).status).toBe(200);

		// The accounts page is for admins only; to a member it does not exist.
		expect((await get('/admin', memberCookie)).status).toBe(404);
		expect((await get('/admin')).status).toBe(404);
		const list = await get('/admin', adminCookie);
		expect(list.status).toBe(200);
		expect(await list.text()).toContain(memberEmail);

		// A member cannot use the action either.
		expect((await form('/admin?/disable', { userId: member.id }, memberCookie)).status).toBe(404);

		const res = await form('/admin?/disable', { userId: member.id }, adminCookie);
		expect(res.status).toBe(200);
		expect(await res.text()).toContain('is disabled and has been signed out everywhere');

		expect(await db.select().from(sessions).where(eq(sessions.userId, member.id))).toHaveLength(0);
		expect((await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie: memberCookie } })).status).toBe(401);

		const again = await form('/signin', { email: memberEmail, password: 'wiper-park-switch' });
		expect(again.status).toBe(403);
		expect(await again.text()).toContain('This account has been disabled by a site admin');
		expect(sessionCookie(again)).toBeNull();

		// Enabled again, it can sign in.
		await form('/admin?/enable', { userId: member.id }, adminCookie);
		await signIn(memberEmail, 'wiper-park-switch');
	});
});
