import { json } from '@sveltejs/kit';
import { ping } from '$lib/server/db';
import type { RequestHandler } from './$types';

// For load balancers and the start command: is this server up, and can it reach PostgreSQL?
export const GET: RequestHandler = async () => {
	const up = await ping();
	return json({ ok: up, db: up ? 'up' : 'down' }, { status: up ? 200 : 503, headers: { 'cache-control': 'no-store' } });
};
