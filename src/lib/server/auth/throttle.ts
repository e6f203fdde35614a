// Failed sign-in counters in PostgreSQL (app servers are stateless; every server sees the same
// counts). The schedule itself is the pure throttle-schedule module.
import { eq, inArray, lt, sql } from 'drizzle-orm';
import { db } from '../db';
import { signInThrottle } from '../db/schema';
import {
	ACCOUNT_POLICY,
	ADDRESS_POLICY,
	decide,
	type ThrottleDecision,
	type ThrottlePolicy
} from './throttle-schedule';

export interface ThrottleKey {
	key: string;
	policy: ThrottlePolicy;
}

export function keysFor(email: string, address: string): ThrottleKey[] {
	return [
		{ key: `account:${email}`, policy: ACCOUNT_POLICY },
		{ key: `address:${address}`, policy: ADDRESS_POLICY }
	];
}

/** The strictest decision over all keys (the longest wait wins). */
export async function check(keys: ThrottleKey[], now = new Date()): Promise<ThrottleDecision> {
	const rows = await db
		.select()
		.from(signInThrottle)
		.where(inArray(signInThrottle.key, keys.map((k) => k.key)));
	let worst: ThrottleDecision = { allowed: true };
	for (const { key, policy } of keys) {
		const row = rows.find((r) => r.key === key) ?? null;
		const decision = decide(row, now, policy);
		if (!decision.allowed && (worst.allowed || decision.retryAfterSeconds > worst.retryAfterSeconds)) {
			worst = decision;
		}
	}
	return worst;
}

/** Counts one failure on every key; a window older than its policy's starts again at one. */
export async function recordFailure(keys: ThrottleKey[], now = new Date()): Promise<void> {
	for (const { key, policy } of keys) {
		// Raw values in sql`` go to the driver as they are: pass times as ISO text, cast in SQL.
		const windowStart = sql`${new Date(now.getTime() - policy.windowSeconds * 1000).toISOString()}::timestamptz`;
		const nowSql = sql`${now.toISOString()}::timestamptz`;
		// One statement, so concurrent failures on two app servers both count.
		await db
			.insert(signInThrottle)
			.values({ key, failures: 1, windowStartedAt: now, lastFailureAt: now })
			.onConflictDoUpdate({
				target: signInThrottle.key,
				set: {
					failures: sql`case when ${signInThrottle.windowStartedAt} <= ${windowStart} then 1 else ${signInThrottle.failures} + 1 end`,
					windowStartedAt: sql`case when ${signInThrottle.windowStartedAt} <= ${windowStart} then ${nowSql} else ${signInThrottle.windowStartedAt} end`,
					lastFailureAt: now
				}
			});
	}
}

/** Forgets counters untouched for a day (every policy's window is shorter), so the table stays small. */
export async function prune(now = new Date()): Promise<void> {
	await db.delete(signInThrottle).where(lt(signInThrottle.lastFailureAt, new Date(now.getTime() - 24 * 60 * 60 * 1000)));
}

/** After a successful sign-in the account's counter starts again (the address's does not). */
export async function clear(key: string): Promise<void> {
	await db.delete(signInThrottle).where(eq(signInThrottle.key, key));
}
