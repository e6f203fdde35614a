import { describe, expect, it } from 'vitest';
import { checkPassword, isCommonPassword, passwordLength, PASSWORD_MAX, PASSWORD_MIN } from './password-policy';

describe('checkPassword', () => {
	// Limits: OWASP ASVS 4.0.3 §2.1.2 (64 allowed, over 128 denied); minimum 8 per NIST SP 800-63B
	// §5.1.1.2. Composition rules are forbidden by ASVS §2.1.9, so lower-case-only phrases pass.
	const cases: { name: string; password: string; accepted: boolean; says?: RegExp }[] = [
		{ name: '7 characters is too short', password: 'gx7#Lq2', accepted: false, says: /at least 8/ },
		{ name: '8 characters is enough', password: 'gx7#Lq2w', accepted: true },
		{ name: '64 characters is allowed (ASVS §2.1.2)', password: 'k'.repeat(32) + 'w'.repeat(32), accepted: true },
		{ name: '128 characters is allowed', password: 'dynamo-'.repeat(18) + 'ab', accepted: true },
		{ name: '129 characters is refused', password: 'dynamo-'.repeat(18) + 'abc', accepted: false, says: /at most 128/ },
		{ name: 'no composition rules: lower-case words', password: 'copper tracer bench lamp', accepted: true },
		{ name: 'no composition rules: digits only, not common', password: '80417263951', accepted: true },
		{ name: 'spaces count and are kept (ASVS §2.1.3)', password: '    a  b    ', accepted: true },
		// These three are in zxcvbn-ts's passwords-common list (checked by isCommonPassword below).
		{ name: 'common: password1', password: 'password1', accepted: false, says: /common passwords/ },
		{ name: 'common: 12345678', password: '12345678', accepted: false, says: /common passwords/ },
		{ name: 'common, whatever the case: ILoveYou', password: 'ILoveYou', accepted: false, says: /common passwords/ },
		{ name: 'the demo password is accepted', password: 'tracer-stripe-demo', accepted: true }
	];
	it.each(cases)('$name', ({ password, accepted, says }) => {
		const refusal = checkPassword(password);
		if (accepted) expect(refusal).toBeNull();
		else expect(refusal).toMatch(says!);
	});

	it('refuses the account’s own e-mail address (NIST SP 800-63B §5.1.1.2, context-specific words)', () => {
		expect(checkPassword('Rider@Example.test', { email: 'rider@example.test' })).toMatch(/e-mail/);
		expect(checkPassword('sidecar-rider', { email: 'sidecar-rider@example.test' })).toMatch(/e-mail/);
		expect(checkPassword('sidecar-rider-2', { email: 'sidecar-rider@example.test' })).toBeNull();
	});

	it('counts characters, not UTF-16 units: 8 emoji are 8 characters (ASVS §2.1.4 allows any Unicode)', () => {
		const eight = '🔋🔧💡🚗🔋🔧💡🚗';
		expect(eight.length).toBe(16);
		expect(passwordLength(eight)).toBe(8);
		expect(checkPassword('🔋🔧💡🚗🔋🔧💡')).toMatch(/at least 8/);
		expect(checkPassword(eight)).toBeNull();
	});

	it('uses the limits the issue asks for', () => {
		expect(PASSWORD_MIN).toBe(8);
		expect(PASSWORD_MAX).toBe(128);
	});
});

describe('isCommonPassword', () => {
	it('knows the entries at the top of the list and not a random phrase', () => {
		// The first entries of zxcvbn-ts's passwords-common (node_modules/@zxcvbn-ts/language-common).
		for (const p of ['123456', 'password', 'qwerty', 'dragon', 'baseball']) expect(isCommonPassword(p)).toBe(true);
		expect(isCommonPassword('ostrimmel-dynamo-bobbin')).toBe(false);
	});
});
