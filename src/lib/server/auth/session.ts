// Starting, reading and ending a signed-in session on a request.
import type { Cookies } from '@sveltejs/kit';
import { and, eq, lt } from 'drizzle-orm';
import type { Cookie } from 'lucia';
import { db } from '../db';
import { sessions } from '../db/schema';
import { lucia } from './lucia';

function write(cookies: Cookies, cookie: Cookie): void {
	cookies.set(cookie.name, cookie.value, { ...cookie.attributes, path: '/' });
}

/**
 * Starts a new session for the account and sets its cookie. Any session the request carried is
 * ended first, so every sign-in gets a fresh session id (OWASP ASVS 4.0.3 §3.2.1).
 */
export async function start(cookies: Cookies, userId: string): Promise<void> {
	const previous = cookies.get(lucia.sessionCookieName);
	if (previous) await lucia.invalidateSession(previous);
	// Lucia never removes expired rows by itself; an account's own are cleared as it signs in.
	await db.delete(sessions).where(and(eq(sessions.userId, userId), lt(sessions.expiresAt, new Date())));
	const session = await lucia.createSession(userId, {});
	write(cookies, lucia.createSessionCookie(session.id));
}

/** Validates the request's session cookie; refreshes it when lucia slid the expiry forward. */
export async function read(cookies: Cookies) {
	const id = cookies.get(lucia.sessionCookieName);
	if (!id) return { user: null, session: null };
	const result = await lucia.validateSession(id);
	if (result.session?.fresh) write(cookies, lucia.createSessionCookie(result.session.id));
	if (!result.session) write(cookies, lucia.createBlankSessionCookie());
	return result;
}

/** Ends the session on the server and clears the cookie (ASVS §3.3.1). */
export async function end(cookies: Cookies, sessionId: string | null | undefined): Promise<void> {
	if (sessionId) await lucia.invalidateSession(sessionId);
	write(cookies, lucia.createBlankSessionCookie());
}

/** Ends every session of an account at once (used when an admin disables it). */
export async function endAllFor(userId: string): Promise<void> {
	await lucia.invalidateUserSessions(userId);
}
