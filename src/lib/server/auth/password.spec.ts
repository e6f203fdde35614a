import { describe, expect, it } from 'vitest';
import { hashPassword, verifyDecoy, verifyPassword } from './password';

describe('hashPassword', () => {
	it('makes an argon2id hash with the OWASP Password Storage Cheat Sheet parameters', async () => {
		const hash = await hashPassword('tracer-stripe-demo');
		// PHC string format: $argon2id$v=19$m=<KiB>,t=<passes>,p=<lanes>$<salt>$<hash>
		// OWASP Password Storage Cheat Sheet: argon2id, m=19456 (19 MiB), t=2, p=1.
		expect(hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
	});

	it('salts: the same password twice gives two different hashes, both verifying', async () => {
		const [a, b] = await Promise.all([hashPassword('copper bench lamp'), hashPassword('copper bench lamp')]);
		expect(a).not.toBe(b);
		expect(await verifyPassword(a, 'copper bench lamp')).toBe(true);
		expect(await verifyPassword(b, 'copper bench lamp')).toBe(true);
	});

	it('refuses a wrong password, a near miss and a malformed stored hash', async () => {
		const hash = await hashPassword('copper bench lamp');
		expect(await verifyPassword(hash, 'copper bench lam')).toBe(false);
		expect(await verifyPassword(hash, 'Copper bench lamp')).toBe(false);
		expect(await verifyPassword('not-a-hash', 'copper bench lamp')).toBe(false);
		expect(await verifyDecoy('copper bench lamp')).toBe(false);
	});
});
