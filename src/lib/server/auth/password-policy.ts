// Which passwords Loomwright accepts. Pure: no database, no hashing.
//
// Sources:
// - OWASP ASVS 4.0.3 §2.1.2: passwords of at least 64 characters are permitted and those over
//   128 are denied. §2.1.9: no composition rules (no "one upper case, one digit").
//   §2.1.7: passwords are checked against a list of breached or common passwords.
//   §2.1.3: no truncation; §2.1.4: any printable Unicode character, spaces included.
// - The minimum of 8 follows NIST SP 800-63B §5.1.1.2 (the choice; ASVS §2.1.1 asks 12).
// The common-password list is zxcvbn-ts's "passwords-common" dictionary (about 49 000 entries,
// all lower case), from @zxcvbn-ts/language-common.
import { dictionary } from '@zxcvbn-ts/language-common';

export const PASSWORD_MIN = 8;
export const PASSWORD_MAX = 128;

let common: Set<string> | null = null;
function commonPasswords(): Set<string> {
	common ??= new Set(dictionary['passwords-common']);
	return common;
}

/** Length in Unicode code points, so an accented letter or an emoji counts once. */
export function passwordLength(password: string): number {
	return [...password].length;
}

export function isCommonPassword(password: string): boolean {
	return commonPasswords().has(password.toLowerCase());
}

/**
 * Returns why a new password is refused, or null when it is accepted.
 * `context` holds words an attacker would try first for this account (its e-mail address).
 * @example checkPassword('tracer-stripe-demo') // null
 */
export function checkPassword(password: string, context: { email?: string } = {}): string | null {
	const length = passwordLength(password);
	if (length < PASSWORD_MIN) return `Use at least ${PASSWORD_MIN} characters (this one has ${length}).`;
	if (length > PASSWORD_MAX) return `Use at most ${PASSWORD_MAX} characters (this one has ${length}).`;
	if (isCommonPassword(password)) {
		return 'That password is on the list of common passwords people try first. Choose another; a few unrelated words work well.';
	}
	const email = context.email?.trim().toLowerCase();
	if (email) {
		const local = email.split('@')[0];
		const lowered = password.toLowerCase();
		if (lowered === email || (local.length >= 4 && lowered === local)) {
			return 'Your password must not be your e-mail address.';
		}
	}
	return null;
}
