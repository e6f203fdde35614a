// Puts the signed-in account and its session on event.locals, and nothing else of note.
import { json, redirect, type Handle, type HandleServerError } from '@sveltejs/kit';
import * as session from '$lib/server/auth/session';
import { close, isDatabaseUnavailable } from '$lib/server/db';
import { databaseUnavailable } from '$lib/server/http';
import { closePlanning } from '$lib/server/planning/pool';
import { localeFrom, TIME_ZONE_COOKIE, timeZoneFrom } from '$lib/dates';
import { findBadField } from '$lib/server/text-guard';

// adapter-node stops taking requests on SIGTERM/SIGINT, then emits this; the idle database pool
// and planning threads would otherwise keep the process alive for ever.
// (Registered once: in development this module is re-run on every change.)
const registered = Symbol.for('loomwright.closeOnShutdown');
const flags = globalThis as typeof globalThis & { [registered]?: true };
if (!flags[registered]) {
	flags[registered] = true;
	process.on('sveltekit:shutdown', () => {
		void close();
		void closePlanning();
	});
}

export const handle: Handle = async ({ event, resolve }) => {
	const isApi = event.url.pathname.startsWith('/api/');
	event.locals.dates = { locale: localeFrom(event.request.headers.get('accept-language')), timeZone: timeZoneFrom(event.cookies.get(TIME_ZONE_COOKIE)) };
	let read: Awaited<ReturnType<typeof session.read>>;
	try {
		read = await session.read(event.cookies);
	} catch (e) {
		if (isDatabaseUnavailable(e)) return withSecurityHeaders(databaseUnavailable(isApi));
		throw e;
	}
	const { user, session: current } = read;
	if (user?.disabled && current) {
		// Disabling ends sessions at once; this catches one created in the same instant.
		await session.end(event.cookies, current.id);
		event.locals.user = null;
		event.locals.session = null;
	} else {
		event.locals.user = user;
		event.locals.session = current;
	}
	// A read-only link may be sent with API reads; access.ts decides what it opens.
	if (event.url.pathname.startsWith('/api/')) {
		const refusal = crossSiteWrite(event.request, event.url.origin);
		if (refusal) return withSecurityHeaders(refusal);
		event.locals.linkToken = event.url.searchParams.get('link') ?? event.request.headers.get('x-loomwright-link');
	}
	const unstorable = await unstorableForm(event.request, event.url.pathname);
	if (unstorable) return withSecurityHeaders(unstorable);
	// Signed-in pages live in the (app) group; its layout redirects too, but form actions run
	// before any layout load, so the same rule is applied here first.
	if (!event.locals.user && event.route.id?.startsWith('/(app)')) {
		const next = event.url.pathname + event.url.search;
		redirect(303, `/signin?next=${encodeURIComponent(next)}`);
	}
	const resolved = await resolve(event);
	// A page or its data whose load failed because the database is away: 503, not the 500 page.
	const response = event.locals.databaseDown && resolved.status >= 500 ? databaseUnavailable(isApi) : resolved;
	return withSecurityHeaders(compressed(event.request, event.url.pathname.startsWith('/api/') ? asApiError(response) : response));
};

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * A form post to a page whose text the database cannot keep (a NUL character, a lone surrogate:
 * text-guard.ts) is answered 400 naming the field before any action runs, so no action has to
 * remember to check. A form enhanced in the browser gets the action-failure shape it reads
 * (`{ type: 'failure', status, data }`, data in devalue's array form), others a short page.
 */
async function unstorableForm(request: Request, pathname: string): Promise<Response | null> {
	if (SAFE_METHODS.has(request.method) || pathname.startsWith('/api/')) return null;
	const type = request.headers.get('content-type') ?? '';
	if (!/^(application\/x-www-form-urlencoded|multipart\/form-data)/i.test(type)) return null;
	let form: FormData;
	try {
		form = await request.clone().formData();
	} catch {
		return null; // SvelteKit answers a body it cannot read itself
	}
	const bad = findBadField(form);
	if (!bad) return null;
	if (request.headers.get('x-sveltekit-action') === 'true') {
		// devalue.stringify({ errors: { [field]: message }, message }): values are indexes into the array.
		const data = JSON.stringify([{ errors: 1, message: 2 }, { [bad.path]: 2 }, bad.message]);
		return json({ type: 'failure', status: 400, data });
	}
	const escaped = bad.message.replace(/[&<>"]/g, (c) => `&#${c.charCodeAt(0)};`);
	return new Response(`<!doctype html><meta charset="utf-8"><title>Loomwright: a field needs fixing</title><p>${escaped}</p><p><a href="${pathname.replace(/[&<>"]/g, '')}">Back to the form</a></p>`, {
		status: 400,
		headers: { 'content-type': 'text/html; charset=utf-8' }
	});
}

/**
 * SvelteKit refuses form posts from other sites; JSON writes to the API get the same check here
 * (OWASP Cross-Site Request Forgery Prevention Cheat Sheet, "Verifying Origin With Standard
 * Headers"): an Origin header naming another site is refused, and so is a browser's write that
 * says (Sec-Fetch-Site) it comes from another site. A client that is not a browser sends neither
 * and is judged by its session or link alone.
 */
function crossSiteWrite(request: Request, ownOrigin: string): Response | null {
	if (SAFE_METHODS.has(request.method)) return null;
	const origin = request.headers.get('origin');
	const site = request.headers.get('sec-fetch-site');
	const foreign = origin !== null ? origin !== ownOrigin : site !== null && site !== 'same-origin' && site !== 'none';
	if (!foreign) return null;
	const res = json({ error: `Writes to the Loomwright API are taken only from ${ownOrigin}; this one came from ${origin ?? 'another site'}.` }, { status: 403 });
	res.headers.set('connection', 'close');
	return res;
}

/**
 * Headers on every answer beside the page's Content-Security-Policy (svelte.config.js): no
 * address of ours (a read-only link's token included) is sent to another site as a referrer,
 * answers are never sniffed as another type, and no site may frame a page (for browsers that
 * predate CSP's frame-ancestors). Headers from a fetch() are immutable, so they are copied once.
 */
function withSecurityHeaders(response: Response): Response {
	const extra: [string, string][] = [
		['referrer-policy', 'same-origin'],
		['x-content-type-options', 'nosniff'],
		['x-frame-options', 'DENY']
	];
	try {
		for (const [name, value] of extra) if (!response.headers.has(name)) response.headers.set(name, value);
		return response;
	} catch {
		const headers = new Headers(response.headers);
		for (const [name, value] of extra) if (!headers.has(name)) headers.set(name, value);
		return new Response(response.body, { status: response.status, statusText: response.statusText, headers });
	}
}

const COMPRESSIBLE = /^(application\/json|text\/html|text\/plain|text\/csv|image\/svg\+xml)/;

// Pages, page data and API answers go out gzip-compressed when the client takes it (RFC 9110
// §8.4): a diagnosis's JSON shrinks several times over a phone's connection. Small answers and
// ones already encoded go as they are.
function compressed(request: Request, response: Response): Response {
	const type = response.headers.get('content-type') ?? '';
	const length = Number(response.headers.get('content-length') ?? Infinity);
	if (
		request.method === 'HEAD' ||
		!response.body ||
		response.status === 204 ||
		response.status === 304 ||
		response.headers.has('content-encoding') ||
		!COMPRESSIBLE.test(type) ||
		length < 1024 ||
		!/\bgzip\b/.test(request.headers.get('accept-encoding') ?? '')
	)
		return response;
	const headers = new Headers(response.headers);
	headers.set('content-encoding', 'gzip');
	headers.delete('content-length');
	headers.append('vary', 'Accept-Encoding');
	return new Response(response.body.pipeThrough(new CompressionStream('gzip')), { status: response.status, statusText: response.statusText, headers });
}

// The API answers every error in its one JSON shape, { error }, including those SvelteKit makes
// itself: 404 for an unknown address and 405 for a method an endpoint does not have.
function asApiError(response: Response): Response {
	if (response.status < 400 || response.headers.get('content-type')?.includes('application/json')) return response;
	const words: Record<number, string> = {
		404: 'There is no such address in the Loomwright API.',
		405: 'This address does not take that method.'
	};
	const answer = json({ error: words[response.status] ?? 'The request could not be handled.' }, { status: response.status });
	const allow = response.headers.get('allow');
	if (allow) answer.headers.set('allow', allow);
	return answer;
}

export const handleError: HandleServerError = ({ error, event, status }) => {
	if (isDatabaseUnavailable(error)) {
		event.locals.databaseDown = true;
		return { message: 'Loomwright cannot reach its database just now. Try again in a few seconds.' };
	}
	if (status !== 404) console.error('[server]', event.request.method, event.url.pathname, error);
	return { message: 'Something went wrong on our side. Try again in a moment.' };
};
