// Files in S3-compatible storage through the AWS SDK (a local s3rver fake in development and
// tests, a hosted service in production; README "Configuration"). Verbs: put, get, remove.
//
// forcePathStyle: the fake (and many S3-compatible services) answer at host/bucket/key, not
// bucket.host. The checksum settings 'WHEN_REQUIRED': newer SDKs add CRC32 trailers to every
// upload, which the fake stores as part of the body (STACK.md, "s3rver with the AWS SDK v3").
// Time limits: the SDK sets none by default, so a store that stalls would hold an upload open
// for ever; a connection that takes over 5 s or a socket idle for 10 s fails and is retried
// (the SDK's default of 3 attempts); and each call, retries included, ends after 8 s, so an upload
// to a stalled store fails within 10 s (a 503 that says the store is away).
import { DeleteObjectCommand, GetObjectCommand, NoSuchKey, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { config } from './config';
import { ServiceUnavailable } from './http';

let client: S3Client | null = null;

function s3(): S3Client {
	client ??= new S3Client({
		endpoint: config.s3.endpoint,
		region: config.s3.region,
		forcePathStyle: config.s3.forcePathStyle,
		credentials: { accessKeyId: config.s3.accessKeyId, secretAccessKey: config.s3.secretAccessKey },
		requestChecksumCalculation: 'WHEN_REQUIRED',
		responseChecksumValidation: 'WHEN_REQUIRED',
		requestHandler: { connectionTimeout: 5_000, socketTimeout: 10_000 }
	});
	return client;
}

/** Longest one call to the store may take (ms), retries included; LOOM_STORE_TIMEOUT_MS overrides. */
const limitMs = () => Number(process.env.LOOM_STORE_TIMEOUT_MS) || 8_000;

const AWAY_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENOTFOUND', 'EAI_AGAIN']);

/** Whether an error says the store is away or stalled (not that the request was wrong). */
function storeAway(e: unknown): boolean {
	const err = e as { name?: string; code?: string; cause?: { code?: string }; $metadata?: { httpStatusCode?: number } };
	return (
		err?.name === 'AbortError' ||
		err?.name === 'TimeoutError' ||
		AWAY_CODES.has(err?.code ?? '') ||
		AWAY_CODES.has(err?.cause?.code ?? '') ||
		(err?.$metadata?.httpStatusCode ?? 0) >= 500
	);
}

/** One call with the time limit; a store that is away or stalled becomes a 503 that says so. */
async function call<T>(run: (abortSignal: AbortSignal) => Promise<T>): Promise<T> {
	try {
		return await run(AbortSignal.timeout(limitMs()));
	} catch (e) {
		if (storeAway(e)) throw new ServiceUnavailable('The file store is not answering; try again in a minute.', 60);
		throw e;
	}
}

export async function put(key: string, body: Uint8Array, contentType: string): Promise<void> {
	await call((abortSignal) =>
		s3().send(new PutObjectCommand({ Bucket: config.s3.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.byteLength }), { abortSignal })
	);
}

/** The stored bytes, or null when there is no such file. */
export async function get(key: string): Promise<Uint8Array | null> {
	try {
		return await call(async (abortSignal) => {
			const out = await s3().send(new GetObjectCommand({ Bucket: config.s3.bucket, Key: key }), { abortSignal });
			return out.Body ? await out.Body.transformToByteArray() : new Uint8Array();
		});
	} catch (e) {
		if (e instanceof NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') return null;
		throw e;
	}
}

/** Deletes files; a missing one is not an error (S3's DELETE is idempotent). */
export async function remove(keys: readonly string[]): Promise<void> {
	for (const key of keys) await call((abortSignal) => s3().send(new DeleteObjectCommand({ Bucket: config.s3.bucket, Key: key }), { abortSignal }));
}
