// Sign-in attempts sent all at once: each is counted in PostgreSQL before its password is
// checked, so a burst gets no more checks than attempts one after another would. The limits
// follow the OWASP Authentication Cheat Sheet ("Login Throttling", "Account Lockout"): the
// account from one address is throttled hard, the account from every address softly, so a
// guesser cannot lock the member out from the member's own address.
import { eq, like } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import * as accounts from '../../src/lib/server/auth/accounts';
import { ACCOUNT_POLICY, PAIR_POLICY } from '../../src/lib/server/auth/throttle-schedule';
import { db } from '../../src/lib/server/db';
import { signInThrottle } from '../../src/lib/server/db/schema';
import { form, unique } from './people';

afterAll(async () => {
	await db.$client.end();
});

async function member(password: string) {
	const email = unique('burst');
	const made = await accounts.createAccount({ email, displayName: 'Burst Member', password });
	if (!made.ok) throw new Error(made.message);
	return email;
}

describe('a burst of sign-ins', () => {
	it('60 wrong passwords sent at once from one address: only the free few are checked, and then the right one waits too', async () => {
		const email = await member('dynamo-cut-out-points');
		const answers = await Promise.all(Array.from({ length: 60 }, (_, i) => form('/signin', { email, password: `guess-number-${i}` })));
		const statuses = answers.map((r) => r.status);
		// Attempt n + 1 is decided on n counted failures: PAIR_POLICY lets freeFailures + 1 through.
		expect(statuses.filter((s) => s === 400)).toHaveLength(PAIR_POLICY.freeFailures + 1);
		expect(statuses.filter((s) => s === 429)).toHaveLength(60 - PAIR_POLICY.freeFailures - 1);
		expect(statuses.filter((s) => s >= 500)).toHaveLength(0);
		const [pair] = await db.select().from(signInThrottle).where(like(signInThrottle.key, `pair:${email}|%`));
		expect(pair.failures).toBe(PAIR_POLICY.freeFailures + 1);

		const right = await form('/signin', { email, password: 'dynamo-cut-out-points' });
		expect(right.status).toBe(429);
		expect(right.headers.getSetCookie().some((c) => c.includes('loomwright_session=') && !c.includes('Max-Age=0'))).toBe(false);

		// The member, at another address, is not held up by the guesser's address.
		const elsewhere = await accounts.signIn(email, 'dynamo-cut-out-points', '203.0.113.77');
		expect(elsewhere.ok).toBe(true);
	});

	it('100 wrong passwords from 100 addresses at once: the account-wide limit checks only its free few', async () => {
		const email = await member('field-coil-brushes');
		const results = await Promise.all(Array.from({ length: 100 }, (_, i) => accounts.signIn(email, `spray-${i}`, `198.51.100.${i + 1}`)));
		const checked = results.filter((r) => !r.ok && r.reason === 'mismatch');
		const refused = results.filter((r) => !r.ok && r.reason === 'throttled');
		expect(checked).toHaveLength(ACCOUNT_POLICY.freeFailures + 1);
		expect(refused).toHaveLength(100 - ACCOUNT_POLICY.freeFailures - 1);
		const [account] = await db.select().from(signInThrottle).where(eq(signInThrottle.key, `account:${email}`));
		expect(account.failures).toBe(ACCOUNT_POLICY.freeFailures + 1);
		// The account-wide wait is the soft one: a minute at most, never the hour.
		const refusal = await accounts.signIn(email, 'field-coil-brushes', '192.0.2.9');
		expect(refusal.ok).toBe(false);
		expect(refusal.ok === false && refusal.message).toMatch(/wait (\d+ seconds|about 1 minute)/);
	});

	it('the right password after a few failures clears the account and releases its own attempt on the address', async () => {
		const email = await member('regulator-cut-in');
		const address = `192.0.2.${10 + Math.floor(Math.random() * 200)}`;
		await accounts.signIn(email, 'nope-one', address);
		await accounts.signIn(email, 'nope-two', address);
		const [before] = await db.select().from(signInThrottle).where(eq(signInThrottle.key, `address:${address}`));
		expect((await accounts.signIn(email, 'regulator-cut-in', address)).ok).toBe(true);
		const [after] = await db.select().from(signInThrottle).where(eq(signInThrottle.key, `address:${address}`));
		expect(after.failures).toBe(before.failures);
		expect(await db.select().from(signInThrottle).where(eq(signInThrottle.key, `account:${email}`))).toHaveLength(0);
		expect(await db.select().from(signInThrottle).where(eq(signInThrottle.key, `pair:${email}|${address}`))).toHaveLength(0);
	});
});
