import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { config } from '../config';
import * as schema from './schema';

// One pool per app server; app servers are stateless, so more of them only need more pool.
const client = postgres(config.databaseUrl, { max: 10, onnotice: () => {} });

export const db = drizzle(client, { schema });
export type Db = typeof db;
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
export { schema };

/** Whether PostgreSQL answers `select 1` within `limitMs`. */
export async function ping(limitMs: number): Promise<boolean> {
	let timer: ReturnType<typeof setTimeout> | undefined;
	const late = new Promise<false>((resolve) => (timer = setTimeout(() => resolve(false), limitMs)));
	const answer = client`select 1`.then(
		() => true,
		() => false
	);
	try {
		return await Promise.race([answer, late]);
	} finally {
		clearTimeout(timer);
	}
}

/** Ends the pool, so a server told to stop (SIGTERM) can exit once its requests are done. */
export async function close(): Promise<void> {
	await client.end({ timeout: 5 });
}
