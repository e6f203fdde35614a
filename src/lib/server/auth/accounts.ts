// Creating accounts, signing in, and disabling accounts. Used by the form actions, the admin
// page and the seed script, so every path hashes and checks passwords the same way.
import { generateIdFromEntropySize } from 'lucia';
import { eq } from 'drizzle-orm';
import { db } from '../db';
import { users, type User } from '../db/schema';
import { normaliseEmail } from './email';
import { hashPassword, verifyDecoy, verifyPassword } from './password';
import { checkPassword } from './password-policy';
import * as throttle from './throttle';
import { describeWait } from './throttle-schedule';
import { endAllFor } from './session';

export type SiteRole = User['role'];

export interface NewAccount {
	email: string;
	displayName: string;
	password: string;
	role?: SiteRole;
}

export type SignUpResult =
	| { ok: true; user: User }
	| { ok: false; field: 'email' | 'password'; message: string };

export async function createAccount(input: NewAccount): Promise<SignUpResult> {
	const email = normaliseEmail(input.email);
	const refusal = checkPassword(input.password, { email });
	if (refusal) return { ok: false, field: 'password', message: refusal };
	const passwordHash = await hashPassword(input.password);
	const [user] = await db
		.insert(users)
		.values({
			id: generateIdFromEntropySize(10),
			email,
			displayName: input.displayName.trim(),
			passwordHash,
			role: input.role ?? 'user'
		})
		.onConflictDoNothing({ target: users.email })
		.returning();
	if (!user) return { ok: false, field: 'email', message: 'An account with this e-mail address already exists. Sign in instead?' };
	return { ok: true, user };
}

export async function findByEmail(email: string): Promise<User | undefined> {
	const [user] = await db.select().from(users).where(eq(users.email, normaliseEmail(email)));
	return user;
}

export type SignInResult =
	| { ok: true; user: User }
	| { ok: false; reason: 'throttled' | 'mismatch' | 'disabled'; status: number; message: string };

export const MISMATCH_MESSAGE =
	'That e-mail address and password do not match an account. Check both and try again.';
export const DISABLED_MESSAGE =
	'This account has been disabled by a site admin, so it cannot sign in. Ask the site admin if you think this is a mistake.';

/**
 * Counts a sign-in attempt on the throttle (atomically, in PostgreSQL), then checks the password.
 * Attempts count against the account from this address, the account from every address and the
 * address (OWASP ASVS 4.0.3 §2.2.1; OWASP Authentication Cheat Sheet, "Login Throttling");
 * the same message covers an unknown address and a wrong password (ASVS §2.2.1 / no account
 * enumeration), and an unknown address costs one argon2 verification like a known one.
 */
export async function signIn(emailInput: string, password: string, address: string): Promise<SignInResult> {
	const email = normaliseEmail(emailInput);
	const keys = throttle.keysFor(email, address);
	const decision = await throttle.reserve(keys);
	if (!decision.allowed) {
		return {
			ok: false,
			reason: 'throttled',
			status: 429,
			message: `Too many failed sign-ins. For your account's safety, wait ${describeWait(decision.retryAfterSeconds)} before trying again.`
		};
	}
	const user = await findByEmail(email);
	const matches = user ? await verifyPassword(user.passwordHash, password) : await verifyDecoy(password);
	if (!user || !matches) {
		// Already counted by reserve: nothing more to record.
		return { ok: false, reason: 'mismatch', status: 400, message: MISMATCH_MESSAGE };
	}
	// Told only to someone who knows the password, so it reveals nothing to a guesser.
	if (user.disabled) return { ok: false, reason: 'disabled', status: 403, message: DISABLED_MESSAGE };
	await throttle.release(keys);
	await throttle.prune();
	return { ok: true, user };
}

/** Disables or re-enables an account; disabling ends all its sessions at once. */
export async function setDisabled(userId: string, disabled: boolean): Promise<User | undefined> {
	const [user] = await db.update(users).set({ disabled }).where(eq(users.id, userId)).returning();
	if (user && disabled) await endAllFor(userId);
	return user;
}

/** What pages may see of an account: never the row (no hash, no flags beyond the role). */
export interface PublicUser {
	id: string;
	displayName: string;
	email: string;
	role: SiteRole;
}

export function publicUser(user: { id: string; displayName: string; email: string; role: SiteRole } | null): PublicUser | null {
	if (!user) return null;
	return { id: user.id, displayName: user.displayName, email: user.email, role: user.role };
}

export type PasswordChange = { ok: true } | { ok: false; field: 'current' | 'password'; message: string };

/** Changes a password after checking the current one (OWASP ASVS 4.0.3 §2.1.5/§2.1.6). */
export async function changePassword(userId: string, current: string, next: string): Promise<PasswordChange> {
	const [user] = await db.select().from(users).where(eq(users.id, userId));
	if (!user || !(await verifyPassword(user.passwordHash, current))) {
		return { ok: false, field: 'current', message: 'That is not your current password.' };
	}
	const refusal = checkPassword(next, { email: user.email });
	if (refusal) return { ok: false, field: 'password', message: refusal };
	if (next === current) return { ok: false, field: 'password', message: 'Choose a password different from the current one.' };
	await db.update(users).set({ passwordHash: await hashPassword(next) }).where(eq(users.id, userId));
	return { ok: true };
}

export async function setNotifyComments(userId: string, on: boolean): Promise<void> {
	await db.update(users).set({ notifyComments: on }).where(eq(users.id, userId));
}
