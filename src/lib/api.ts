// The one way client pages talk to Loomwright's JSON API. Every answer comes back as a value:
// `{ ok: true, data }` or `{ ok: false, status, error, issues }`, never a thrown HTTP error, so a
// page can show the message (and the field paths) where they belong.

export interface ApiIssue {
	path: string;
	message: string;
}

export type ApiResult<T> =
	| { ok: true; status: number; data: T }
	| { ok: false; status: number; error: string; issues: ApiIssue[]; body: Record<string, unknown> };

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export async function request<T>(
	method: Method,
	path: string,
	body?: unknown,
	fetcher: typeof fetch = fetch
): Promise<ApiResult<T>> {
	let response: Response;
	try {
		response = await fetcher(path, {
			method,
			headers: body === undefined ? { accept: 'application/json' } : { accept: 'application/json', 'content-type': 'application/json' },
			body: body === undefined ? undefined : JSON.stringify(body)
		});
	} catch {
		return { ok: false, status: 0, error: 'Could not reach Loomwright. Check the connection and try again.', issues: [], body: {} };
	}
	const text = await response.text();
	let parsed: unknown = null;
	try {
		parsed = text ? JSON.parse(text) : null;
	} catch {
		parsed = null;
	}
	if (response.ok) return { ok: true, status: response.status, data: parsed as T };
	const errorBody = (parsed && typeof parsed === 'object' ? parsed : {}) as Record<string, unknown>;
	return {
		ok: false,
		status: response.status,
		error: typeof errorBody.error === 'string' ? errorBody.error : `The server answered ${response.status}.`,
		issues: Array.isArray(errorBody.issues) ? (errorBody.issues as ApiIssue[]) : [],
		body: errorBody
	};
}

export const api = {
	get: <T>(path: string, fetcher?: typeof fetch) => request<T>('GET', path, undefined, fetcher),
	post: <T>(path: string, body: unknown, fetcher?: typeof fetch) => request<T>('POST', path, body, fetcher),
	put: <T>(path: string, body: unknown, fetcher?: typeof fetch) => request<T>('PUT', path, body, fetcher),
	patch: <T>(path: string, body: unknown, fetcher?: typeof fetch) => request<T>('PATCH', path, body, fetcher),
	delete: <T = null>(path: string, fetcher?: typeof fetch) => request<T>('DELETE', path, undefined, fetcher)
};
