// One-time e-mail links: confirming an address and resetting a password.
// A reset link lasts one hour and works once; only its SHA-256 is stored; using it ends every
// session of the account (OWASP Forgot Password Cheat Sheet: "URL tokens", "invalidate sessions").
import { and, count, eq, gt, lt } from 'drizzle-orm';
import { db } from '../db';
import { emailTokens, users, type User } from '../db/schema';
import * as mail from '../mail';
import { hashPassword } from './password';
import { checkPassword } from './password-policy';
import { endAllFor } from './session';
import { hashToken, looksLikeToken, newToken } from './tokens';

export const RESET_LIFETIME_MS = 60 * 60 * 1000;
export const VERIFY_LIFETIME_MS = 48 * 60 * 60 * 1000;

type Purpose = 'verify' | 'reset';

async function issue(userId: string, purpose: Purpose, lifetimeMs: number): Promise<string> {
	const token = newToken();
	// Old, spent-by-time rows of any account are cleared as new ones are made.
	await db.delete(emailTokens).where(lt(emailTokens.expiresAt, new Date()));
	await db.insert(emailTokens).values({ tokenHash: hashToken(token), userId, purpose, expiresAt: new Date(Date.now() + lifetimeMs) });
	return token;
}

/** The account a live token belongs to, without using it up (to show the reset form). */
export async function peek(token: string, purpose: Purpose): Promise<User | null> {
	if (!looksLikeToken(token)) return null;
	const [row] = await db
		.select({ user: users })
		.from(emailTokens)
		.innerJoin(users, eq(users.id, emailTokens.userId))
		.where(and(eq(emailTokens.tokenHash, hashToken(token)), eq(emailTokens.purpose, purpose), gt(emailTokens.expiresAt, new Date())));
	return row?.user ?? null;
}

/** Uses a token up: one DELETE … RETURNING, so of two requests racing with one link only one wins. */
async function consume(token: string, purpose: Purpose): Promise<string | null> {
	if (!looksLikeToken(token)) return null;
	const [row] = await db
		.delete(emailTokens)
		.where(and(eq(emailTokens.tokenHash, hashToken(token)), eq(emailTokens.purpose, purpose), gt(emailTokens.expiresAt, new Date())))
		.returning({ userId: emailTokens.userId });
	return row?.userId ?? null;
}

export async function sendVerification(user: Pick<User, 'id' | 'email' | 'displayName'>): Promise<void> {
	const token = await issue(user.id, 'verify', VERIFY_LIFETIME_MS);
	await mail.verification(user.email, user.displayName, mail.link(`/verify/${token}`));
}

export async function verify(token: string): Promise<User | null> {
	const userId = await consume(token, 'verify');
	if (!userId) return null;
	const [user] = await db.update(users).set({ emailVerifiedAt: new Date() }).where(eq(users.id, userId)).returning();
	return user ?? null;
}

/** At most this many reset e-mails an hour per account, so the form cannot flood an inbox. */
export const RESETS_PER_HOUR = 3;

/** Sends a reset link when the address has an account; says nothing either way (no enumeration). */
export async function requestReset(user: User | undefined): Promise<void> {
	if (!user || user.disabled) return;
	const [recent] = await db
		.select({ n: count() })
		.from(emailTokens)
		.where(and(eq(emailTokens.userId, user.id), eq(emailTokens.purpose, 'reset'), gt(emailTokens.createdAt, new Date(Date.now() - RESET_LIFETIME_MS))));
	if ((recent?.n ?? 0) >= RESETS_PER_HOUR) return;
	const token = await issue(user.id, 'reset', RESET_LIFETIME_MS);
	await mail.passwordReset(user.email, user.displayName, mail.link(`/reset/${token}`));
}

export type ResetResult = { ok: true; user: User } | { ok: false; field: 'password' | 'token'; message: string };

export const LINK_SPENT =
	'This link has been used already or is more than an hour old. Ask for a new one below.';

export async function resetPassword(token: string, password: string): Promise<ResetResult> {
	const owner = await peek(token, 'reset');
	if (!owner) return { ok: false, field: 'token', message: LINK_SPENT };
	const refusal = checkPassword(password, { email: owner.email });
	if (refusal) return { ok: false, field: 'password', message: refusal };
	const passwordHash = await hashPassword(password);
	const userId = await consume(token, 'reset');
	if (!userId) return { ok: false, field: 'token', message: LINK_SPENT };
	const [user] = await db.update(users).set({ passwordHash }).where(eq(users.id, userId)).returning();
	// Every other reset link of the account dies with this one, and every session ends.
	await db.delete(emailTokens).where(and(eq(emailTokens.userId, userId), eq(emailTokens.purpose, 'reset')));
	await endAllFor(userId);
	return { ok: true, user };
}
