// Local stand-ins for the hosted services, on loopback only:
//  - an SMTP catcher (smtp-server) that keeps every message and lists them over HTTP
//    (GET /messages, DELETE /messages) for the admin "caught mail" page and the tests;
//  - an S3-compatible store (s3rver) in the project's data folder, with the bucket created.
// Production points SMTP_* and S3_* at real services instead (README "Configuration").
import { createServer } from 'node:http';
import { mkdirSync } from 'node:fs';
import { SMTPServer } from 'smtp-server';
import S3rver from 's3rver';

const env = process.env;
const smtpPort = Number(env.SMTP_PORT ?? 2525);
const mailApiPort = Number(env.MAIL_API_PORT ?? smtpPort + 1);
const s3Port = Number(new URL(env.S3_ENDPOINT ?? 'http://127.0.0.1:4569').port);
const bucket = env.S3_BUCKET ?? 'loomwright-pages';
const s3Dir = env.S3_DIR ?? new URL('../.data/s3', import.meta.url).pathname;

type Caught = { id: number; from: string; to: string[]; raw: string; receivedAt: string };
const caught: Caught[] = [];
let nextId = 1;

const smtp = new SMTPServer({
	authOptional: true,
	disabledCommands: ['STARTTLS'],
	onData(stream, session, callback) {
		const chunks: Buffer[] = [];
		stream.on('data', (c: Buffer) => chunks.push(c));
		stream.on('end', () => {
			caught.push({
				id: nextId++,
				from: session.envelope.mailFrom ? session.envelope.mailFrom.address : '',
				to: session.envelope.rcptTo.map((r) => r.address),
				raw: Buffer.concat(chunks).toString('utf8'),
				receivedAt: new Date().toISOString()
			});
			if (caught.length > 500) caught.shift();
			callback();
		});
	}
});

const mailApi = createServer((req, res) => {
	if (req.url?.startsWith('/messages')) {
		if (req.method === 'DELETE') caught.length = 0;
		res.setHeader('content-type', 'application/json');
		res.end(JSON.stringify(caught));
		return;
	}
	res.statusCode = 404;
	res.end();
});

mkdirSync(s3Dir, { recursive: true });
const s3 = new S3rver({
	address: '127.0.0.1',
	port: s3Port,
	directory: s3Dir,
	silent: true,
	configureBuckets: [{ name: bucket, configs: [] }]
});

await new Promise<void>((resolve) => smtp.listen(smtpPort, '127.0.0.1', resolve));
await new Promise<void>((resolve) => mailApi.listen(mailApiPort, '127.0.0.1', resolve));
await s3.run();
console.log(`[fakes] smtp 127.0.0.1:${smtpPort}, caught mail http://127.0.0.1:${mailApiPort}/messages, s3 http://127.0.0.1:${s3Port}/${bucket}`);

const stop = async () => {
	smtp.close();
	mailApi.close();
	await s3.close();
	process.exit(0);
};
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
