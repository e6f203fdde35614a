// Where to send someone after signing in: only a path on this site, never another site
// (OWASP ASVS 4.0.3 §5.1.5, open redirects).
export function safeNext(next: string | null | undefined, fallback = '/garage'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
	// Control characters and backslashes can turn a path into another origin in some browsers.
	if (/[\u0000-\u001f\\]/.test(next)) return fallback;
	return next;
}
