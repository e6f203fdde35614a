// When the next sign-in attempt for a throttle key is allowed. Pure: the caller brings the
// stored counters and the clock.
//
// OWASP ASVS 4.0.3 §2.2.1: anti-automation that keeps failed attempts on one account to no more
// than 100 an hour; "soft lockout" with growing delays rather than a hard lock that an attacker
// could use to shut a restorer out. Each key has a policy: the first few failures are free, then
// every further failure doubles the wait up to a ceiling, and a hard hourly cap sits behind it.

import { counted } from '$lib/words';

export interface ThrottlePolicy {
	/** Failures allowed in a window before any wait. */
	freeFailures: number;
	/** Wait after the first failure beyond the free ones, in seconds; doubles with each more. */
	firstDelaySeconds: number;
	maxDelaySeconds: number;
	/** Hard cap of failures per window (ASVS §2.2.1: at most 100 an hour per account). */
	maxFailuresPerWindow: number;
	windowSeconds: number;
}

/**
 * One account from one client address (keyed by the lower-cased e-mail and the address): the
 * strict limit. OWASP Authentication Cheat Sheet, "Login Throttling": throttle on the pair so a
 * guesser at one address is slowed at once while the member, elsewhere, is not.
 */
export const PAIR_POLICY: ThrottlePolicy = {
	freeFailures: 4,
	firstDelaySeconds: 30,
	maxDelaySeconds: 15 * 60,
	maxFailuresPerWindow: 100,
	windowSeconds: 60 * 60
};

/**
 * One account from every address together: softer, against guessing spread over many addresses.
 * Its wait never passes a minute, so an attacker cannot keep a member out for long (OWASP
 * Authentication Cheat Sheet: an account lockout must not become a denial of service), and
 * ASVS 4.0.3 §2.2.1's 100 failures an hour per account is never reached under its delays.
 */
export const ACCOUNT_POLICY: ThrottlePolicy = {
	freeFailures: 20,
	firstDelaySeconds: 10,
	maxDelaySeconds: 60,
	maxFailuresPerWindow: 100,
	windowSeconds: 60 * 60
};

/** One client address: looser, since a club night can share one address. */
export const ADDRESS_POLICY: ThrottlePolicy = {
	freeFailures: 40,
	firstDelaySeconds: 10,
	maxDelaySeconds: 5 * 60,
	maxFailuresPerWindow: 1000,
	windowSeconds: 60 * 60
};

export interface ThrottleState {
	failures: number;
	windowStartedAt: Date;
	lastFailureAt: Date;
}

/**
 * Seconds to wait after the `failures`-th failure before the next attempt.
 * @example delayAfter(5, ACCOUNT_POLICY) // 30
 */
export function delayAfter(failures: number, policy: ThrottlePolicy): number {
	if (failures <= policy.freeFailures) return 0;
	const doublings = failures - policy.freeFailures - 1;
	// Cap the exponent before Math.pow so huge counts cannot overflow to Infinity.
	const delay = policy.firstDelaySeconds * 2 ** Math.min(doublings, 30);
	return Math.min(delay, policy.maxDelaySeconds);
}

/** Whether a stored window has run out, so its counters start again from zero. */
export function windowExpired(state: ThrottleState, now: Date, policy: ThrottlePolicy): boolean {
	return now.getTime() - state.windowStartedAt.getTime() >= policy.windowSeconds * 1000;
}

export type ThrottleDecision = { allowed: true } | { allowed: false; retryAfterSeconds: number };

export function decide(state: ThrottleState | null, now: Date, policy: ThrottlePolicy): ThrottleDecision {
	if (!state || windowExpired(state, now, policy)) return { allowed: true };
	const nowMs = now.getTime();
	let until = state.lastFailureAt.getTime() + delayAfter(state.failures, policy) * 1000;
	if (state.failures >= policy.maxFailuresPerWindow) {
		until = Math.max(until, state.windowStartedAt.getTime() + policy.windowSeconds * 1000);
	}
	if (until <= nowMs) return { allowed: true };
	return { allowed: false, retryAfterSeconds: Math.ceil((until - nowMs) / 1000) };
}

/** "about 2 minutes" — how long to wait, in words for the sign-in form. */
export function describeWait(seconds: number): string {
	if (seconds < 60) return counted(seconds, 'second');
	const minutes = Math.ceil(seconds / 60);
	return `about ${counted(minutes, 'minute')}`;
}
