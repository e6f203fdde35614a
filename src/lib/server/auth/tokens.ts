// Link tokens for e-mails and read-only links: 256 random bits, written base64url (43 letters,
// no "=" so a quoted-printable mail body cannot mangle it), and kept in the database only as the
// SHA-256 of the token (OWASP Forgot Password Cheat Sheet, "URL tokens"; a leaked table does not
// give working links).
import { createHash, randomBytes } from 'node:crypto';

export function newToken(): string {
	return randomBytes(32).toString('base64url');
}

/** Lower-case hex SHA-256 (FIPS 180-4) of the token as UTF-8. */
export function hashToken(token: string): string {
	return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A token as sent never has other characters; anything else cannot name a row. */
export function looksLikeToken(raw: string): boolean {
	return /^[A-Za-z0-9_-]{43}$/.test(raw);
}
