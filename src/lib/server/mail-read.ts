// Reading a caught message (raw RFC 5322 text from the local SMTP catcher) well enough to show
// it: headers (unfolded, RFC 2047 encoded words decoded), and the plain-text and HTML bodies of a
// MIME message (RFC 2045 quoted-printable and base64; RFC 2046 multipart). Pure; used by the
// caught-mail page and the tests that follow links in mail.

export interface ReadMessage {
	subject: string;
	from: string;
	to: string;
	date: string;
	text: string;
	html: string;
}

/** Splits a message or part into its header lines (unfolded, RFC 5322 §2.2.3) and body. */
function splitPart(raw: string): { headers: Map<string, string>; body: string } {
	const normal = raw.replace(/\r\n/g, '\n');
	const cut = normal.indexOf('\n\n');
	const head = cut === -1 ? normal : normal.slice(0, cut);
	const body = cut === -1 ? '' : normal.slice(cut + 2);
	const headers = new Map<string, string>();
	let last = '';
	for (const line of head.split('\n')) {
		if (/^[ \t]/.test(line) && last) {
			headers.set(last, headers.get(last) + ' ' + line.trim());
			continue;
		}
		const colon = line.indexOf(':');
		if (colon <= 0) continue;
		last = line.slice(0, colon).trim().toLowerCase();
		headers.set(last, line.slice(colon + 1).trim());
	}
	return { headers, body };
}

function bytesToText(bytes: number[], charset: string): string {
	try {
		return new TextDecoder(charset || 'utf-8').decode(new Uint8Array(bytes));
	} catch {
		return new TextDecoder('utf-8').decode(new Uint8Array(bytes));
	}
}

/** RFC 2045 §6.7: "=XX" is a byte, "=" at a line end is a soft break. */
export function decodeQuotedPrintable(input: string, charset = 'utf-8'): string {
	const joined = input.replace(/=\r?\n/g, '');
	const bytes: number[] = [];
	for (let i = 0; i < joined.length; i++) {
		const c = joined[i];
		if (c === '=' && /^[0-9A-Fa-f]{2}$/.test(joined.slice(i + 1, i + 3))) {
			bytes.push(parseInt(joined.slice(i + 1, i + 3), 16));
			i += 2;
		} else {
			for (const b of new TextEncoder().encode(c)) bytes.push(b);
		}
	}
	return bytesToText(bytes, charset);
}

/** RFC 2047 encoded words, "=?charset?B|Q?text?=", in a header value. */
export function decodeHeader(value: string): string {
	return value
		.replace(/\?=\s+=\?/g, '?==?')
		.replace(/=\?([^?]+)\?([BbQq])\?([^?]*)\?=/g, (_, charset: string, enc: string, text: string) => {
			if (enc.toUpperCase() === 'B') return bytesToText([...Buffer.from(text, 'base64')], charset);
			return decodeQuotedPrintable(text.replace(/_/g, ' '), charset);
		});
}

function param(header: string | undefined, name: string): string {
	const m = header?.match(new RegExp(`${name}="?([^";]+)"?`, 'i'));
	return m ? m[1] : '';
}

function decodeBody(body: string, headers: Map<string, string>): string {
	const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
	const charset = param(headers.get('content-type'), 'charset') || 'utf-8';
	if (encoding === 'quoted-printable') return decodeQuotedPrintable(body, charset);
	if (encoding === 'base64') return bytesToText([...Buffer.from(body.replace(/\s+/g, ''), 'base64')], charset);
	return body;
}

function walk(raw: string, out: { text: string; html: string }): void {
	const { headers, body } = splitPart(raw);
	const type = (headers.get('content-type') ?? 'text/plain').toLowerCase();
	if (type.startsWith('multipart/')) {
		const boundary = param(headers.get('content-type'), 'boundary');
		if (!boundary) return;
		const pieces = body.split(`--${boundary}`);
		// The first piece is the preamble; the one after the closing "--boundary--" the epilogue.
		for (const piece of pieces.slice(1)) {
			if (piece.startsWith('--')) break;
			walk(piece.replace(/^\n/, ''), out);
		}
		return;
	}
	const decoded = decodeBody(body, headers).replace(/\n$/, '');
	if (type.startsWith('text/html')) out.html ||= decoded;
	else if (type.startsWith('text/plain')) out.text ||= decoded;
}

export function readMessage(raw: string): ReadMessage {
	const { headers } = splitPart(raw);
	const out = { text: '', html: '' };
	walk(raw, out);
	const h = (name: string) => decodeHeader(headers.get(name) ?? '');
	return { subject: h('subject'), from: h('from'), to: h('to'), date: h('date'), ...out };
}

/** Every http(s) address in a plain-text body, in order. */
export function linksIn(text: string): string[] {
	return text.match(/https?:\/\/[^\s<>"]+/g) ?? [];
}
