// Where to send someone after signing in: only a path on this site, never another site
// (OWASP ASVS 4.0.3 §5.1.5, open redirects).
export function safeNext(next: string | null | undefined, fallback = '/garage'): string {
	if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return fallback;
	// Control characters and backslashes can turn a path into another origin in some browsers.
	if (/[\u0000-\u001f\\]/.test(next)) return fallback;
	// A Location header carries only Latin-1 (RFC 9110 §5.5; fetch's Headers refuse anything
	// above U+00FF): other characters go percent-encoded as UTF-8 (RFC 3986 §2.1), and a string
	// that is not text at all (a lone surrogate) is no place to go.
	try {
		return next.replace(/[^\u0021-\u007e]+/g, (run) => encodeURIComponent(run));
	} catch {
		return fallback;
	}
}
