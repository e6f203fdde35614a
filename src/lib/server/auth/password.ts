// Password hashing with argon2id.
// Parameters from the OWASP Password Storage Cheat Sheet (argon2id: m=19456 KiB (19 MiB),
// t=2 iterations, p=1 degree of parallelism). The hash is a PHC string that carries its own
// salt and parameters, so the parameters can be raised later without breaking old hashes.
import { hash, verify } from '@node-rs/argon2';

export const ARGON2_OPTIONS = {
	memoryCost: 19456,
	timeCost: 2,
	parallelism: 1,
	outputLen: 32
	// algorithm: @node-rs/argon2 defaults to Argon2id (its `Algorithm` is an ambient const enum,
	// which isolated modules cannot reference; the unit test checks the PHC prefix instead).
} as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		// A malformed stored hash never signs anyone in.
		return false;
	}
}

// Verified against when no account has the e-mail address, so an unknown address takes about as
// long as a wrong password (OWASP Authentication Cheat Sheet, "Authentication responses").
let decoy: Promise<string> | null = null;
export async function verifyDecoy(password: string): Promise<false> {
	decoy ??= hashPassword(crypto.randomUUID());
	await verifyPassword(await decoy, password);
	return false;
}
