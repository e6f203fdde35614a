import { drizzle } from 'drizzle-orm/postgres-js';
import postgres from 'postgres';
import { config } from '../config';
import * as schema from './schema';

// One pool per app server; app servers are stateless, so more of them only need more pool.
// Time limits: connect_timeout (seconds) bounds the wait for a connection, statement_timeout
// (PostgreSQL's own setting, sent when each connection starts) bounds a statement's run.
const client = postgres(config.databaseUrl, {
	max: 10,
	onnotice: () => {},
	connect_timeout: config.dbConnectTimeoutSeconds,
	connection: { statement_timeout: config.dbStatementTimeoutMs }
});

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

// Errors that mean the database cannot be reached or answer now, not that the request is wrong:
// socket errors, postgres.js's own connection codes, and SQLSTATE classes 08 (connection
// exception) and 57 (operator intervention: shutdown, cannot connect now, statement timeout
// 57014), and 53300 (too many connections) (PostgreSQL manual, Appendix A).
const UNREACHABLE = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EPIPE', 'ENOTFOUND', 'EAI_AGAIN', 'CONNECT_TIMEOUT', 'CONNECTION_CLOSED', 'CONNECTION_ENDED', 'CONNECTION_DESTROYED', '53300']);

/** Whether an error (or one it wraps, as Drizzle's query errors do) says the database is away. */
export function isDatabaseUnavailable(error: unknown): boolean {
	for (let e = error, hops = 0; e && typeof e === 'object' && hops < 5; e = (e as { cause?: unknown }).cause, hops++) {
		const code = (e as { code?: unknown }).code;
		if (typeof code === 'string' && (UNREACHABLE.has(code) || code.startsWith('08') || code.startsWith('57'))) return true;
		if (e instanceof AggregateError && e.errors.some((inner) => isDatabaseUnavailable(inner))) return true;
	}
	return false;
}

/** Seconds a client is asked to wait (Retry-After) while the database is away. */
export const DATABASE_RETRY_SECONDS = 5;

/** Ends the pool, so a server told to stop (SIGTERM) can exit once its requests are done. */
export async function close(): Promise<void> {
	await client.end({ timeout: 5 });
}
