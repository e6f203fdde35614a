import { describe, expect, it } from 'vitest';
import { decodeHeader, decodeQuotedPrintable, linksIn, readMessage } from './mail-read';

describe('decodeQuotedPrintable', () => {
	// RFC 2045 §6.7 rules (1) "=XX" octets and (5) soft line breaks "=" + CRLF, worked by hand.
	it.each([
		['caf=C3=A9', 'café'],
		['a long line that was wrapped=\r\nhere', 'a long line that was wrappedhere'],
		['token=3Dabc', 'token=abc'],
		['no escapes at all', 'no escapes at all']
	])('%s', (input, expected) => expect(decodeQuotedPrintable(input)).toBe(expected));
});

describe('decodeHeader', () => {
	// RFC 2047 §8 examples: "=?ISO-8859-1?Q?Andr=E9?= Pirard" and adjacent encoded words join.
	it('decodes Q and B encoded words', () => {
		expect(decodeHeader('=?ISO-8859-1?Q?Andr=E9?= Pirard')).toBe('André Pirard');
		expect(decodeHeader('=?ISO-8859-1?Q?a?= =?ISO-8859-1?Q?b?=')).toBe('ab');
		expect(decodeHeader('=?UTF-8?B?Q2x1YiBuaWdodA==?=')).toBe('Club night');
		expect(decodeHeader('=?UTF-8?Q?Tracer_stripe?=')).toBe('Tracer stripe');
	});
});

describe('readMessage', () => {
	// A multipart/alternative message built by hand after RFC 2046 §5.1.4's layout.
	const raw = [
		'From: Loomwright <no-reply@loomwright.test>',
		'To: ann@example.test',
		'Subject: =?UTF-8?Q?Reset_your_password?=',
		'Content-Type: multipart/alternative;',
		' boundary="--b1"',
		'',
		'preamble',
		'----b1',
		'Content-Type: text/plain; charset=utf-8',
		'Content-Transfer-Encoding: quoted-printable',
		'',
		'Open http://localhost/reset/abc_DEF-123 within an hour. Caf=C3=A9 open=',
		's late.',
		'----b1',
		'Content-Type: text/html; charset=utf-8',
		'Content-Transfer-Encoding: base64',
		'',
		Buffer.from('<p>Open the link</p>').toString('base64'),
		'----b1--',
		''
	].join('\r\n');

	it('finds the headers and both bodies', () => {
		const m = readMessage(raw);
		expect(m.subject).toBe('Reset your password');
		expect(m.to).toBe('ann@example.test');
		expect(m.text).toBe('Open http://localhost/reset/abc_DEF-123 within an hour. Café opens late.');
		expect(m.html).toBe('<p>Open the link</p>');
		expect(linksIn(m.text)).toEqual(['http://localhost/reset/abc_DEF-123']);
	});
});
