// The demo vehicle, its maker and its club carry invented names that no real vehicle or maker
// has used; an earlier name turned out to be a real model name and was retired everywhere.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const read = (path: string) => readFileSync(new URL(`../../../${path}`, import.meta.url), 'utf8');
const RETIRED = /kestr|hartw|pryce/i;

describe('demo names', () => {
	it.each(['README.md', 'scripts/seed.ts'])('%s names the invented demo vehicle, maker and club, and no retired name', (path) => {
		const text = read(path);
		expect(text).not.toMatch(RETIRED);
		expect(text).toContain('Ostrimmel');
	});

	it('seeds the vehicle, its maker and its club under the invented names', () => {
		const seed = read('scripts/seed.ts');
		expect(seed).toContain("'The Ostrimmel'");
		expect(seed).toContain("make: 'Ombrith & Vessick'");
		expect(seed).toContain("name: 'Ostrimmel Tourer Register'");
	});
});
