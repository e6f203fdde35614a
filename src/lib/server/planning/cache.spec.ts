import { describe, expect, it } from 'vitest';
import { PlanCache } from './cache';

describe('PlanCache', () => {
	it('runs once for concurrent requests of one key, and keeps the answer', async () => {
		const cache = new PlanCache<number>();
		let runs = 0;
		const make = () => new Promise<number>((r) => setTimeout(() => r(++runs), 10));
		const [a, b] = await Promise.all([cache.getOrMake('k', make), cache.getOrMake('k', make)]);
		expect([a, b, runs]).toEqual([1, 1, 1]);
		expect(await cache.getOrMake('k', make)).toBe(1);
		expect(runs).toBe(1);
	});

	it('drops the least recently used past its size, and keeps nothing from a failed run', async () => {
		const cache = new PlanCache<string>(2);
		cache.set('a', 'A');
		cache.set('b', 'B');
		cache.get('a');
		cache.set('c', 'C');
		expect([cache.get('a'), cache.get('b'), cache.get('c')]).toEqual(['A', undefined, 'C']);
		await expect(cache.getOrMake('d', () => Promise.reject(new Error('no')))).rejects.toThrow('no');
		expect(cache.get('d')).toBeUndefined();
		expect(await cache.getOrMake('d', async () => 'D')).toBe('D');
	});

	it('does not keep a run without a key', async () => {
		const cache = new PlanCache<number>();
		let runs = 0;
		await cache.getOrMake(null, async () => ++runs);
		await cache.getOrMake(null, async () => ++runs);
		expect(runs).toBe(2);
	});
});
