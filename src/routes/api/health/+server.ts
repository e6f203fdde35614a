import { json } from '@sveltejs/kit';
import { ping } from '$lib/server/db';
import type { RequestHandler } from './$types';

// A load balancer waits on this answer: a database that does not answer at all counts as down
// after this long, rather than holding the check open for the driver's own connect time-out.
const PING_LIMIT_MS = 3000;

// For load balancers and the start command: is this server up, and can it reach PostgreSQL?
export const GET: RequestHandler = async () => {
	const up = await ping(PING_LIMIT_MS);
	return json({ ok: up, db: up ? 'up' : 'down' }, { status: up ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
