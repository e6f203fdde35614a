import { inject } from 'vitest';
import * as accounts from '../../src/lib/server/auth/accounts';

/** The built app server's origin, started by global-setup.ts. */
export function baseUrl(): string {
	return inject('baseUrl');
}

export const unique = (name: string) => `${name.toLowerCase().replace(/\W+/g, '-')}-${crypto.randomUUID().slice(0, 8)}@example.test`;

export interface SignedIn {
	id: string;
	email: string;
	cookie: string;
}

/** A new account, signed in through the sign-in form as a browser would (origin header included). */
export async function signedInAccount(name: string, password = 'bobbin-cutout-contacts'): Promise<SignedIn> {
	const email = unique(name);
	const created = await accounts.createAccount({ email, displayName: name, password });
	if (!created.ok) throw new Error(created.message);
	const res = await fetch(`${baseUrl()}/signin`, {
		method: 'POST',
		redirect: 'manual',
		headers: { origin: baseUrl(), accept: 'text/html', 'content-type': 'application/x-www-form-urlencoded' },
		body: new URLSearchParams({ email, password })
	});
	const cookie = res.headers.getSetCookie().find((c) => c.startsWith('__Host-loomwright_session='));
	if (!cookie) throw new Error(`sign-in for ${email} gave no session cookie (status ${res.status})`);
	return { id: created.user.id, email, cookie: cookie.split(';')[0] };
}

/** A JSON API call; the body is parsed when there is one. */
export async function api(method: string, path: string, cookie: string | null, body?: unknown) {
	const res = await fetch(baseUrl() + path, {
		method,
		headers: {
			accept: 'application/json',
			...(cookie ? { cookie } : {}),
			...(body !== undefined ? { 'content-type': 'application/json' } : {})
		},
		body: body === undefined ? undefined : typeof body === 'string' ? body : JSON.stringify(body)
	});
	const text = await res.text();
	// eslint-disable-next-line @typescript-eslint/no-explicit-any
	return { status: res.status, body: (text ? JSON.parse(text) : null) as any };
}
