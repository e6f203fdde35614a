// Failed sign-in counters in PostgreSQL (app servers are stateless; every server sees the same
// counts). The schedule itself is the pure throttle-schedule module.
import { asc, eq, inArray, lt, sql } from 'drizzle-orm';
import { db } from '../db';
import { signInThrottle } from '../db/schema';
import {
	ACCOUNT_POLICY,
	ADDRESS_POLICY,
	PAIR_POLICY,
	decide,
	windowExpired,
	type ThrottleDecision,
	type ThrottlePolicy
} from './throttle-schedule';

export interface ThrottleKey {
	key: string;
	policy: ThrottlePolicy;
}

/**
 * The counters one attempt counts on: the account from this address (strict), the account from
 * every address (soft) and the address over every account (for guessing spread over accounts).
 */
export function keysFor(email: string, address: string): ThrottleKey[] {
	return [
		{ key: `pair:${email}|${address}`, policy: PAIR_POLICY },
		{ key: `account:${email}`, policy: ACCOUNT_POLICY },
		{ key: `address:${address}`, policy: ADDRESS_POLICY }
	];
}

/**
 * Counts one attempt on every key before its password is checked, in one transaction that holds
 * the keys' rows (locked in key order, so two attempts never wait on each other in a circle): of
 * any number of attempts sent at once, only those the schedule allows are counted and checked,
 * on any number of app servers. A refused attempt counts nowhere. The attempt stays counted as a
 * failure unless `release` is called after the right password.
 */
export async function reserve(keys: ThrottleKey[], now = new Date()): Promise<ThrottleDecision> {
	const sorted = [...keys].sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
	return db.transaction(async (tx) => {
		await tx
			.insert(signInThrottle)
			.values(sorted.map(({ key }) => ({ key, failures: 0, windowStartedAt: now, lastFailureAt: now })))
			.onConflictDoNothing({ target: signInThrottle.key });
		const rows = await tx
			.select()
			.from(signInThrottle)
			.where(inArray(signInThrottle.key, sorted.map((k) => k.key)))
			.orderBy(asc(signInThrottle.key))
			.for('update');
		// An attempt that waited for the locks may carry a clock reading older than the one the
		// attempt before it wrote; time for this attempt is never before what is already recorded.
		const at = new Date(Math.max(now.getTime(), ...rows.map((r) => r.lastFailureAt.getTime())));
		let worst: ThrottleDecision = { allowed: true };
		for (const { key, policy } of sorted) {
			const decision = decide(rows.find((r) => r.key === key) ?? null, at, policy);
			if (!decision.allowed && (worst.allowed || decision.retryAfterSeconds > worst.retryAfterSeconds)) worst = decision;
		}
		if (!worst.allowed) return worst;
		for (const { key, policy } of sorted) {
			const row = rows.find((r) => r.key === key)!;
			const fresh = windowExpired(row, at, policy);
			await tx
				.update(signInThrottle)
				.set({ failures: fresh ? 1 : row.failures + 1, windowStartedAt: fresh ? at : row.windowStartedAt, lastFailureAt: at })
				.where(eq(signInThrottle.key, key));
		}
		return worst;
	});
}

/**
 * After the right password: the account's counters start again (the member proved who they are)
 * and the address's loses the attempt counted for this sign-in.
 */
export async function release(keys: ThrottleKey[]): Promise<void> {
	const [pair, account, address] = keys;
	await db.delete(signInThrottle).where(inArray(signInThrottle.key, [pair.key, account.key]));
	await db
		.update(signInThrottle)
		.set({ failures: sql`greatest(${signInThrottle.failures} - 1, 0)` })
		.where(eq(signInThrottle.key, address.key));
}

/** Forgets counters untouched for a day (every policy's window is shorter), so the table stays small. */
export async function prune(now = new Date()): Promise<void> {
	await db.delete(signInThrottle).where(lt(signInThrottle.lastFailureAt, new Date(now.getTime() - 24 * 60 * 60 * 1000)));
}
