// The JSON API's edges: one error shape everywhere,
// `{ error: string, issues?: [{ path, message }] }`, and body parsing that names bad fields.
import { error, isHttpError, json, type RequestEvent } from '@sveltejs/kit';
import type { z } from 'zod';
import { fromZod, type Issue } from './issues';
import { findBadLine, findBadValue } from './text-guard';
import { DATABASE_RETRY_SECONDS, isDatabaseUnavailable } from './db';

export interface ApiError {
	error: string;
	issues?: Issue[];
	/** Only on 409: the diagram's current revision. */
	revision?: number;
}

export function apiError(status: number, body: ApiError): Response {
	return json(body, { status });
}

/** Thrown inside a handler to answer 400 with the issues. */
export class BadRequest extends Error {
	constructor(
		message: string,
		readonly issues?: Issue[]
	) {
		super(message);
	}
}

/** Thrown when a request body is larger than the server takes (BODY_SIZE_LIMIT): 413. */
export class PayloadTooLarge extends Error {}

/** Thrown when the server cannot take the work now (planning threads busy, a plan over its budget): 503 with Retry-After. */
export class ServiceUnavailable extends Error {
	constructor(
		message: string,
		readonly retryAfterSeconds: number
	) {
		super(message);
	}
}

/** For a page's load: work the server cannot take now becomes SvelteKit's 503 page with the reason. */
export async function orUnavailable<T>(work: Promise<T>): Promise<T> {
	try {
		return await work;
	} catch (e) {
		if (e instanceof ServiceUnavailable) error(503, e.message);
		throw e;
	}
}

/** Wraps an endpoint so thrown errors (access checks, bad bodies) become the JSON error shape. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export function endpoint<E extends RequestEvent<any, any>>(
	handler: (event: E) => Promise<Response>
): (event: E) => Promise<Response> {
	return async (event: E) => {
		try {
			return await handler(event);
		} catch (e) {
			const res = answerFor(event, e);
			await drain(event.request, res);
			return res;
		}
	};
}

function answerFor(event: RequestEvent, e: unknown): Response {
	if (e instanceof BadRequest) return apiError(400, { error: e.message, issues: e.issues });
	if (e instanceof PayloadTooLarge) {
		const res = apiError(413, { error: e.message });
		res.headers.set('connection', 'close');
		return res;
	}
	if (e instanceof ServiceUnavailable) {
		const res = apiError(503, { error: e.message });
		res.headers.set('retry-after', String(e.retryAfterSeconds));
		return res;
	}
	if (isHttpError(e)) return apiError(e.status, { error: e.body.message });
	if (isDatabaseUnavailable(e)) return databaseUnavailable(true);
	console.error('[api]', event.request.method, event.url.pathname, e);
	return apiError(500, { error: 'Something went wrong on our side. Try again in a moment.' });
}

/**
 * The answer while PostgreSQL is away: 503 with Retry-After (RFC 9110 §15.6.4, §10.2.3), the API's
 * JSON shape for /api, a short page of its own for pages (no database is needed to show it).
 */
export function databaseUnavailable(api: boolean): Response {
	const words = 'Loomwright cannot reach its database just now. Nothing you sent was saved; try again in a few seconds.';
	const headers = { 'retry-after': String(DATABASE_RETRY_SECONDS), 'cache-control': 'no-store' };
	if (api) return json({ error: words }, { status: 503, headers });
	const page = `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Loomwright: back in a moment</title><body style="font-family:system-ui,sans-serif;max-width:36rem;margin:3rem auto;padding:0 1rem;line-height:1.5"><h1>Back in a moment</h1><p>${words}</p><p><a href="">Try again</a></p></body></html>`;
	return new Response(page, { status: 503, headers: { ...headers, 'content-type': 'text/html; charset=utf-8' } });
}

/**
 * An error answered before the request's body was read (an upload refused by the access check,
 * say) reads the rest of that body first: left half-read, the connection could carry the
 * client's next request into the unread bytes and leave it waiting for an answer that never
 * comes. A body the server will not take (over BODY_SIZE_LIMIT) closes the connection instead
 * (RFC 9112 §9.6).
 */
async function drain(request: Request, res: Response): Promise<void> {
	if (request.body === null || request.bodyUsed) return;
	try {
		await request.arrayBuffer();
	} catch {
		res.headers.set('connection', 'close');
	}
}

/**
 * Reads and validates a JSON body: a body over the size limit throws PayloadTooLarge; malformed
 * JSON, text the database cannot keep (NUL, lone surrogates), nesting deeper than MAX_DEPTH or a
 * failed schema throws BadRequest naming the field.
 */
export async function readBody<S extends z.ZodType>(request: Request, schema: S, options: { fileFields?: string[] } = {}): Promise<z.infer<S>> {
	let text: string;
	try {
		text = await request.text();
	} catch (e) {
		// adapter-node stops reading at BODY_SIZE_LIMIT and fails the stream with status 413.
		if ((e as { status?: number })?.status === 413) throw new PayloadTooLarge(`The request body is larger than this server takes (${process.env.BODY_SIZE_LIMIT ?? '512K'}).`);
		throw new BadRequest('The request body could not be read.');
	}
	let body: unknown;
	try {
		body = JSON.parse(text);
	} catch {
		throw new BadRequest('The request body is not valid JSON.');
	}
	// A file sent as text (fileFields) has its problems named by row rather than by field.
	const files = options.fileFields ?? [];
	const rest = files.length && body !== null && typeof body === 'object' && !Array.isArray(body) ? Object.fromEntries(Object.entries(body).filter(([k]) => !files.includes(k))) : body;
	const bad = findBadValue(rest);
	if (bad) throw new BadRequest(bad.message, [bad]);
	for (const field of files) {
		const value = (body as Record<string, unknown>)[field];
		const line = typeof value === 'string' ? findBadLine(value) : null;
		if (line) throw new BadRequest(line.message, [{ path: `row ${line.row}`, message: line.message }]);
	}
	const parsed = schema.safeParse(body);
	if (!parsed.success) throw new BadRequest('Some fields need fixing.', fromZod(parsed.error));
	return parsed.data;
}

export { error };
