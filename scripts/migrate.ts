// Applies drizzle-kit's migrations in drizzle/ with drizzle's migrator (start command and tests).
import { drizzle } from 'drizzle-orm/postgres-js';
import { migrate } from 'drizzle-orm/postgres-js/migrator';
import postgres from 'postgres';
import { config } from '../src/lib/server/config';

// max 1 and no notices: the migrator prints "already exists" notices on re-runs otherwise.
const client = postgres(config.databaseUrl, { max: 1, onnotice: () => {} });
try {
	await migrate(drizzle(client), { migrationsFolder: new URL('../drizzle', import.meta.url).pathname });
	console.log('[migrate] database is up to date');
} finally {
	await client.end();
}
