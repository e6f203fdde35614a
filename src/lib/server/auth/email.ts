// One spelling of an e-mail address: trimmed and lower-cased, so "Ann@Example.test" and
// "ann@example.test" are one account (the users table stores only this form).
export function normaliseEmail(email: string): string {
	return email.trim().toLowerCase();
}
