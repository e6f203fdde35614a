// Sessions stored in PostgreSQL through lucia 3 and its Drizzle adapter.
// Cookie: httpOnly (always, by lucia), SameSite=Lax, Path=/; in production Secure with the
// `__Host-` prefix (OWASP ASVS 4.0.3 §3.4.1 Secure, §3.4.2 HttpOnly, §3.4.3 SameSite,
// §3.4.4 `__Host-` prefix). Sessions slide: lucia extends one that is used in the second half of
// its lifetime, and hooks.server.ts then sends the refreshed cookie.
import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import { config } from '../config';
import { db } from '../db';
import { sessions, users, type User } from '../db/schema';

const adapter = new DrizzlePostgreSQLAdapter(db, sessions, users);

export const SESSION_COOKIE = config.secureCookies ? '__Host-loomwright_session' : 'loomwright_session';

export const lucia = new Lucia(adapter, {
	sessionExpiresIn: new TimeSpan(30, 'd'),
	sessionCookie: {
		name: SESSION_COOKIE,
		attributes: { secure: config.secureCookies, sameSite: 'lax', path: '/' }
	},
	// Never the password hash: only what pages and access rules need.
	getUserAttributes: (row) => ({
		email: row.email,
		displayName: row.displayName,
		role: row.role,
		disabled: row.disabled
	})
});

declare module 'lucia' {
	interface Register {
		Lucia: typeof lucia;
		DatabaseUserAttributes: Omit<User, 'id'>;
		DatabaseSessionAttributes: { userAgent?: string };
	}
}
