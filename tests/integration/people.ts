// Accounts, sign-in and caught mail for the sharing and account tests: each test makes people of
// its own (unique e-mail addresses) and talks to the built server as a browser would.
import { expect } from 'vitest';
import * as accounts from '../../src/lib/server/auth/accounts';
import { readMessage, linksIn, type ReadMessage } from '../../src/lib/server/mail-read';
import { baseUrl } from './helpers';

export const COOKIE = '__Host-loomwright_session';
export const unique = (name: string) => `${name}-${crypto.randomUUID().slice(0, 8)}@example.test`;

export interface Person {
	id: string;
	email: string;
	password: string;
	displayName: string;
	cookie: string;
}

export function form(path: string, fields: Record<string, string>, cookie?: string) {
	return fetch(baseUrl() + path, {
		method: 'POST',
		redirect: 'manual',
		headers: {
			origin: baseUrl(),
			accept: 'text/html',
			'content-type': 'application/x-www-form-urlencoded',
			...(cookie ? { cookie } : {})
		},
		body: new URLSearchParams(fields)
	});
}

export function get(path: string, cookie?: string) {
	return fetch(baseUrl() + path, { redirect: 'manual', headers: { accept: 'text/html', ...(cookie ? { cookie } : {}) } });
}

export function api(method: string, path: string, cookie?: string, body?: unknown) {
	return fetch(baseUrl() + path, {
		method,
		redirect: 'manual',
		headers: {
			origin: baseUrl(),
			accept: 'application/json',
			...(body !== undefined ? { 'content-type': 'application/json' } : {}),
			...(cookie ? { cookie } : {})
		},
		body: body === undefined ? undefined : JSON.stringify(body)
	});
}

export function cookieFrom(res: Response): string | null {
	const line = res.headers.getSetCookie().find((c) => c.startsWith(`${COOKIE}=`) && !c.startsWith(`${COOKIE}=;`));
	return line ? line.split(';')[0] : null;
}

export async function signIn(email: string, password: string): Promise<string> {
	const res = await form('/signin', { email, password });
	expect(res.status).toBe(303);
	const cookie = cookieFrom(res);
	expect(cookie).toBeTruthy();
	return cookie!;
}

/** A new account made directly (no mail), signed in through the real form. */
export async function person(name: string, role: 'user' | 'admin' = 'user'): Promise<Person> {
	const email = unique(name.toLowerCase().replace(/\W+/g, '.'));
	const password = `loom-${crypto.randomUUID()}`;
	const made = await accounts.createAccount({ email, displayName: name, password, role });
	if (!made.ok) throw new Error(made.message);
	return { id: made.user.id, email, password, displayName: name, cookie: await signIn(email, password) };
}

const mailApi = () => `http://127.0.0.1:${process.env.MAIL_API_PORT ?? 2626}/messages`;

/** Waits for the newest caught message to `to` whose subject matches. */
export async function mailTo(to: string, subject: RegExp, timeoutMs = 10_000): Promise<ReadMessage & { links: string[] }> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const caught = (await (await fetch(mailApi())).json()) as { to: string[]; raw: string }[];
		const found = caught
			.filter((m) => m.to.includes(to))
			.map((m) => readMessage(m.raw))
			.filter((m) => subject.test(m.subject))
			.at(-1);
		if (found) return { ...found, links: linksIn(found.text) };
		if (Date.now() > deadline) throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
		await new Promise((r) => setTimeout(r, 150));
	}
}

/** How many caught messages went to `to`. */
export async function mailCount(to: string): Promise<number> {
	const caught = (await (await fetch(mailApi())).json()) as { to: string[] }[];
	return caught.filter((m) => m.to.includes(to)).length;
}

/** The path of a link (drops the origin, which is the server's configured ORIGIN). */
export const pathOf = (url: string) => {
	const u = new URL(url);
	return u.pathname + u.search;
};
