// Outgoing e-mail through nodemailer over SMTP. In development and tests the server is the local
// catcher (scripts/fakes.ts); in production SMTP_HOST/PORT/USER/PASSWORD/SECURE come from the
// environment (config.ts). Every message is plain text with a simple HTML twin, and each kind of
// message has its own function so the words live in one place.
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from './config';

let transport: Transporter | null = null;
function transporter(): Transporter {
	transport ??= nodemailer.createTransport({
		host: config.smtp.host,
		port: config.smtp.port,
		secure: config.smtp.secure,
		auth: config.smtp.user ? { user: config.smtp.user, pass: config.smtp.password ?? '' } : undefined,
		// The local catcher speaks plain SMTP on loopback; a real server may offer STARTTLS.
		ignoreTLS: config.smtp.host === '127.0.0.1' && !config.smtp.secure
	});
	return transport;
}

const escape = (s: string) =>
	s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

interface Message {
	to: string;
	subject: string;
	/** Paragraphs of plain text; the HTML body is made from the same words. */
	paragraphs: string[];
	link?: { url: string; label: string };
}

const SIGN_OFF = 'Loomwright, wiring diagrams for old vehicles';

function render(m: Message): { text: string; html: string } {
	const text = [...m.paragraphs, ...(m.link ? [`${m.link.label}:\n${m.link.url}`] : []), `— ${SIGN_OFF}`].join('\n\n');
	const html = [
		'<div style="font-family:sans-serif;color:#1b1f24;max-width:36em">',
		...m.paragraphs.map((p) => `<p>${escape(p)}</p>`),
		m.link
			? `<p><a href="${escape(m.link.url)}" style="display:inline-block;background:#9a4a12;color:#f7f4ee;padding:10px 16px;border-radius:8px;text-decoration:none;font-weight:600">${escape(m.link.label)}</a></p><p style="font-size:90%">${escape(m.link.url)}</p>`
			: '',
		`<p style="color:#3d4651">— ${escape(SIGN_OFF)}</p>`,
		'</div>'
	].join('\n');
	return { text, html };
}

async function send(m: Message): Promise<void> {
	const { text, html } = render(m);
	await transporter().sendMail({ from: config.smtp.from, to: m.to, subject: m.subject, text, html });
}

/** Sends, and on failure logs instead of failing the request that caused it. */
async function sendQuietly(m: Message): Promise<boolean> {
	try {
		await send(m);
		return true;
	} catch (e) {
		console.error('[mail] could not send “%s” to %s:', m.subject, m.to, e);
		return false;
	}
}

export const link = (path: string) => new URL(path, config.origin).toString();

export function verification(to: string, name: string, url: string) {
	return sendQuietly({
		to,
		subject: 'Confirm your e-mail address for Loomwright',
		paragraphs: [
			`Hello ${name},`,
			'Someone (we hope you) made a Loomwright account with this address. Follow the link to confirm it is yours. It works once, within two days.',
			'If this was not you, ignore this message: nothing more will happen.'
		],
		link: { url, label: 'Confirm my address' }
	});
}

export function passwordReset(to: string, name: string, url: string) {
	return sendQuietly({
		to,
		subject: 'Reset your Loomwright password',
		paragraphs: [
			`Hello ${name},`,
			'Follow the link to choose a new password. It works once, within one hour. Setting a new password signs your account out everywhere.',
			'If you did not ask for this, ignore this message; your password stays as it is.'
		],
		link: { url, label: 'Choose a new password' }
	});
}

export function clubInvitation(to: string, clubName: string, inviter: string, url: string) {
	return sendQuietly({
		to,
		subject: `${inviter} invites you to ${clubName} on Loomwright`,
		paragraphs: [
			`${inviter} invites you to join the club “${clubName}” on Loomwright, where members share checked wiring diagrams of their vehicles.`,
			'Open the link to accept or decline. Sign in (or make an account) with this e-mail address first. The link works once, within seven days.'
		],
		link: { url, label: 'See the invitation' }
	});
}

export function diagramShared(to: string, owner: string, title: string, level: string, url: string) {
	return sendQuietly({
		to,
		subject: `${owner} shared “${title}” with you`,
		paragraphs: [`${owner} shared the diagram “${title}” with you on Loomwright (you may ${level} it).`],
		link: { url, label: 'Open the diagram' }
	});
}

export function newComment(to: string, author: string, title: string, where: string, excerpt: string, url: string) {
	return sendQuietly({
		to,
		subject: `${author} commented on “${title}”`,
		paragraphs: [
			`${author} left a comment on ${where} of your diagram “${title}”:`,
			excerpt,
			'You can turn these e-mails off on your account page.'
		],
		link: { url, label: 'Read and reply' }
	});
}
