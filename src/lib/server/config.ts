// Every setting the server reads from its environment, in one place (see README "Configuration").
// process.env rather than $env so scripts, tests and the app share one module.
const env = process.env;

/**
 * The caught-mail page shows every reset link, so it is on only when asked for (LOOM_DEV_MAIL=1,
 * which the start command sets for the demo) and only while mail goes to the local catcher: an
 * SMTP server on this machine without credentials. A deployment that sends real mail (another
 * host, or a user and password) never shows it, whatever LOOM_DEV_MAIL says.
 */
export function devMailAllowed(e: Record<string, string | undefined>): boolean {
	const host = e.SMTP_HOST ?? '127.0.0.1';
	const loopback = host === 'localhost' || host === '::1' || /^127\./.test(host);
	return e.LOOM_DEV_MAIL === '1' && loopback && !e.SMTP_USER && !e.SMTP_PASSWORD;
}

export const config = {
	databaseUrl: env.DATABASE_URL ?? 'postgres://loomwright@127.0.0.1:54329/loomwright',
	// Secure, __Host- prefixed session cookie in production. Browsers accept Secure cookies on
	// http://localhost, so the demo keeps them; LOOM_INSECURE_COOKIES=1 is for plain http on a LAN.
	secureCookies: env.NODE_ENV === 'production' && env.LOOM_INSECURE_COOKIES !== '1',
	origin: env.ORIGIN ?? 'http://localhost:5173',
	// How long the pool waits for PostgreSQL to accept a connection, and the longest a statement
	// may run, before the request is answered 503 (a database that is away or stuck then costs a
	// visitor about a second, not the driver's 30 s default).
	dbConnectTimeoutSeconds: Number(env.LOOM_DB_CONNECT_TIMEOUT_S ?? 1.5),
	dbStatementTimeoutMs: Number(env.LOOM_DB_STATEMENT_TIMEOUT_MS ?? 15000),
	smtp: {
		host: env.SMTP_HOST ?? '127.0.0.1',
		port: Number(env.SMTP_PORT ?? 2525),
		user: env.SMTP_USER,
		password: env.SMTP_PASSWORD,
		secure: env.SMTP_SECURE === '1',
		from: env.MAIL_FROM ?? 'Loomwright <no-reply@loomwright.test>'
	},
	s3: {
		endpoint: env.S3_ENDPOINT ?? 'http://127.0.0.1:4569',
		region: env.S3_REGION ?? 'us-east-1',
		bucket: env.S3_BUCKET ?? 'loomwright-pages',
		accessKeyId: env.S3_ACCESS_KEY_ID ?? 'S3RVER',
		secretAccessKey: env.S3_SECRET_ACCESS_KEY ?? 'S3RVER',
		forcePathStyle: env.S3_FORCE_PATH_STYLE !== '0'
	},
	// Shows the caught-mail page (reset and verification links) to admins: see devMailAllowed.
	devMail: devMailAllowed(env),
	// The local SMTP catcher's list of caught messages (scripts/fakes.ts), read by that page.
	caughtMailUrl:
		env.CAUGHT_MAIL_URL ?? `http://127.0.0.1:${env.MAIL_API_PORT ?? Number(env.SMTP_PORT ?? 2525) + 1}/messages`
};
