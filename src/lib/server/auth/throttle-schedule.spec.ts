import { describe, expect, it } from 'vitest';
import { ACCOUNT_POLICY, PAIR_POLICY, ADDRESS_POLICY, decide, delayAfter, describeWait, type ThrottlePolicy } from './throttle-schedule';

const at = (s: number) => new Date(Date.UTC(2026, 0, 1, 0, 0, 0) + s * 1000);

describe('delayAfter (account-and-address policy)', () => {
	// Worked by hand from the policy: 4 free failures, then 30 s doubling, capped at 15 min.
	const table: [failures: number, seconds: number][] = [
		[0, 0],
		[4, 0],
		[5, 30],
		[6, 60],
		[7, 120],
		[8, 240],
		[9, 480],
		[10, 900],
		[11, 900],
		[1000, 900]
	];
	it.each(table)('after %i failures waits %i s', (failures, seconds) => {
		expect(delayAfter(failures, PAIR_POLICY)).toBe(seconds);
	});

	it('never shrinks as failures grow', () => {
		for (let n = 1; n < 200; n++) {
			expect(delayAfter(n + 1, PAIR_POLICY)).toBeGreaterThanOrEqual(delayAfter(n, PAIR_POLICY));
		}
	});
});

/** Simulates an attacker who retries the moment each wait ends, for one hour. */
function failuresInAnHour(policy: ThrottlePolicy): number {
	let state = null as null | { failures: number; windowStartedAt: Date; lastFailureAt: Date };
	let t = 0;
	let failures = 0;
	while (t < 3600) {
		const d = decide(state, at(t), policy);
		if (!d.allowed) {
			t += d.retryAfterSeconds;
			continue;
		}
		failures++;
		state = state
			? { ...state, failures: state.failures + 1, lastFailureAt: at(t) }
			: { failures: 1, windowStartedAt: at(t), lastFailureAt: at(t) };
		t += 1;
	}
	return failures;
}

describe('decide', () => {
	it('allows a first attempt and attempts within the free failures', () => {
		expect(decide(null, at(0), PAIR_POLICY)).toEqual({ allowed: true });
		const state = { failures: 4, windowStartedAt: at(0), lastFailureAt: at(10) };
		expect(decide(state, at(10), PAIR_POLICY)).toEqual({ allowed: true });
	});

	it('makes the fifth failure wait 30 s, counted from that failure', () => {
		const state = { failures: 5, windowStartedAt: at(0), lastFailureAt: at(100) };
		expect(decide(state, at(100), PAIR_POLICY)).toEqual({ allowed: false, retryAfterSeconds: 30 });
		expect(decide(state, at(120), PAIR_POLICY)).toEqual({ allowed: false, retryAfterSeconds: 10 });
		expect(decide(state, at(130), PAIR_POLICY)).toEqual({ allowed: true });
	});

	it('starts again once the hour window has passed', () => {
		const state = { failures: 50, windowStartedAt: at(0), lastFailureAt: at(3000) };
		expect(decide(state, at(3599), PAIR_POLICY).allowed).toBe(false);
		expect(decide(state, at(3600), PAIR_POLICY)).toEqual({ allowed: true });
	});

	it('holds the hard cap until the window ends even with no delays', () => {
		const noDelay: ThrottlePolicy = { ...PAIR_POLICY, freeFailures: 1000 };
		const state = { failures: 100, windowStartedAt: at(0), lastFailureAt: at(200) };
		expect(decide(state, at(200), noDelay)).toEqual({ allowed: false, retryAfterSeconds: 3400 });
	});

	it('keeps one account under 100 failed attempts an hour (OWASP ASVS 4.0.3 §2.2.1)', () => {
		expect(failuresInAnHour(PAIR_POLICY)).toBeLessThanOrEqual(100);
		// Even with the delays switched off, the hourly cap alone holds the line.
		expect(failuresInAnHour({ ...PAIR_POLICY, freeFailures: 10_000 })).toBe(100);
	});

	it('gives one address more room than one account (a club night shares an address)', () => {
		expect(failuresInAnHour(ADDRESS_POLICY)).toBeGreaterThan(failuresInAnHour(PAIR_POLICY));
	});

	// OWASP Authentication Cheat Sheet ("Login Throttling", "Account Lockout"): throttle the
	// account-and-address pair hard and the account as a whole softly, so that guessing from many
	// addresses is slowed without letting an attacker keep the member out.
	it('limits one account from every address more softly than from one address', () => {
		expect(ACCOUNT_POLICY.freeFailures).toBeGreaterThan(PAIR_POLICY.freeFailures);
		expect(failuresInAnHour(ACCOUNT_POLICY)).toBeLessThanOrEqual(100);
		// However many failures, the account-wide wait is at most a minute.
		for (const n of [21, 22, 30, 99]) expect(delayAfter(n, ACCOUNT_POLICY)).toBeLessThanOrEqual(60);
		expect(delayAfter(20, ACCOUNT_POLICY)).toBe(0);
		expect(delayAfter(21, ACCOUNT_POLICY)).toBe(10);
	});
});

describe('describeWait', () => {
	it.each([
		[1, '1 second'],
		[30, '30 seconds'],
		[60, 'about 1 minute'],
		[61, 'about 2 minutes'],
		[900, 'about 15 minutes']
	])('%i s reads "%s"', (s, words) => expect(describeWait(s)).toBe(words));
});
