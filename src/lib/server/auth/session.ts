// Starting, reading and ending a signed-in session on a request.
import type { Cookies } from '@sveltejs/kit';
import { createHash } from 'node:crypto';
import { and, desc, eq, gt, lt, ne } from 'drizzle-orm';
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
export async function start(cookies: Cookies, userId: string, userAgent = ''): Promise<void> {
	const previous = cookies.get(lucia.sessionCookieName);
	if (previous) await lucia.invalidateSession(previous);
	// Lucia never removes expired rows by itself; an account's own are cleared as it signs in.
	await db.delete(sessions).where(and(eq(sessions.userId, userId), lt(sessions.expiresAt, new Date())));
	const session = await lucia.createSession(userId, { userAgent: userAgent.slice(0, 300) });
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

/** A short handle for a session that is not its id (the id is the credential, never shown). */
export function handleOf(sessionId: string): string {
	return createHash('sha256').update(sessionId).digest('hex').slice(0, 24);
}

export interface SessionListing {
	handle: string;
	current: boolean;
	createdAt: string;
	expiresAt: string;
	userAgent: string;
}

/** The account's live sessions, newest first. */
export async function listFor(userId: string, currentId: string | null | undefined): Promise<SessionListing[]> {
	const rows = await db
		.select()
		.from(sessions)
		.where(and(eq(sessions.userId, userId), gt(sessions.expiresAt, new Date())))
		.orderBy(desc(sessions.createdAt));
	return rows.map((s) => ({
		handle: handleOf(s.id),
		current: s.id === currentId,
		createdAt: s.createdAt.toISOString(),
		expiresAt: s.expiresAt.toISOString(),
		userAgent: s.userAgent
	}));
}

/** Ends one of the account's own sessions by its handle; false when there is none such. */
export async function endByHandle(userId: string, handle: string): Promise<boolean> {
	const rows = await db.select({ id: sessions.id }).from(sessions).where(eq(sessions.userId, userId));
	const found = rows.find((r) => handleOf(r.id) === handle);
	if (!found) return false;
	await lucia.invalidateSession(found.id);
	return true;
}

/** Ends every session of the account except the one in use. */
export async function endOthers(userId: string, keepId: string): Promise<number> {
	const ended = await db
		.delete(sessions)
		.where(and(eq(sessions.userId, userId), ne(sessions.id, keepId)))
		.returning({ id: sessions.id });
	return ended.length;
}
