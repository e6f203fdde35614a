// Security headers on pages and API answers, and the Origin check on JSON writes.
// Sources: OWASP Content Security Policy Cheat Sheet (frame-ancestors 'none' against
// clickjacking, nonces for scripts); OWASP Cross-Site Request Forgery Prevention Cheat Sheet
// ("Verifying Origin With Standard Headers"); W3C Referrer Policy.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { db } from '../../src/lib/server/db';
import { baseUrl } from './helpers';
import { person, type Person } from './people';

let owner: Person;
beforeAll(async () => {
	owner = await person('Header Owner');
});
afterAll(async () => {
	await db.$client.end();
});

const vehicle = { name: 'Origin car', systemVoltage: 12, earthPolarity: 'negative' };

async function vehicleCount(): Promise<number> {
	const res = await fetch(`${baseUrl()}/api/vehicles`, { headers: { cookie: owner.cookie, accept: 'application/json' } });
	return ((await res.json()) as { vehicles: unknown[] }).vehicles.length;
}

describe('headers', () => {
	it('pages carry a Content-Security-Policy with a script nonce and no framing, and a Referrer-Policy', async () => {
		for (const path of ['/', '/signin', '/garage']) {
			const res = await fetch(baseUrl() + path, { headers: { cookie: owner.cookie, accept: 'text/html' } });
			expect(res.status, path).toBe(200);
			const csp = res.headers.get('content-security-policy') ?? '';
			expect(csp, path).toContain("frame-ancestors 'none'");
			expect(csp, path).toContain("object-src 'none'");
			expect(csp, path).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]+'/);
			expect(csp, path).not.toMatch(/script-src[^;]*unsafe-inline/);
			// The nonce in the header is the one on the page's own start-up script.
			const nonce = csp.match(/'nonce-([^']+)'/)![1];
			expect(await res.text(), path).toContain(`nonce="${nonce}"`);
			expect(res.headers.get('referrer-policy'), path).toBe('same-origin');
			expect(res.headers.get('x-content-type-options'), path).toBe('nosniff');
		}
	});

	it('API answers carry the Referrer-Policy and nosniff too', async () => {
		const res = await fetch(`${baseUrl()}/api/health`);
		expect(res.headers.get('referrer-policy')).toBe('same-origin');
		expect(res.headers.get('x-content-type-options')).toBe('nosniff');
	});
});

describe('JSON writes from another site', () => {
	it('are refused with 403 when the Origin header names another site, and nothing is stored', async () => {
		const before = await vehicleCount();
		const res = await fetch(`${baseUrl()}/api/vehicles`, {
			method: 'POST',
			headers: { cookie: owner.cookie, origin: 'https://elsewhere.example', 'content-type': 'application/json', accept: 'application/json' },
			body: JSON.stringify(vehicle)
		});
		expect(res.status).toBe(403);
		expect((await res.json()).error).toMatch(/only from/);
		expect(await vehicleCount()).toBe(before);
	});

	it('are refused when a browser says the write is cross-site (Sec-Fetch-Site) without an Origin', async () => {
		const before = await vehicleCount();
		const res = await fetch(`${baseUrl()}/api/vehicles`, {
			method: 'POST',
			headers: { cookie: owner.cookie, 'sec-fetch-site': 'cross-site', 'content-type': 'application/json', accept: 'application/json' },
			body: JSON.stringify(vehicle)
		});
		expect(res.status).toBe(403);
		expect(await vehicleCount()).toBe(before);
	});

	it('are taken from the app itself', async () => {
		const before = await vehicleCount();
		const res = await fetch(`${baseUrl()}/api/vehicles`, {
			method: 'POST',
			headers: { cookie: owner.cookie, origin: baseUrl(), 'sec-fetch-site': 'same-origin', 'content-type': 'application/json', accept: 'application/json' },
			body: JSON.stringify(vehicle)
		});
		expect(res.status).toBe(201);
		expect(await vehicleCount()).toBe(before + 1);
	});
});
