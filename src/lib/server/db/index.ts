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

export async function ping(): Promise<boolean> {
	try {
		await client`select 1`;
		return true;
	} catch {
		return false;
	}
}

/** Ends the pool, so a server told to stop (SIGTERM) can exit once its requests are done. */
export async function close(): Promise<void> {
	await client.end({ timeout: 5 });
}
