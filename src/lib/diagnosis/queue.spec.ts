import { describe, expect, it } from 'vitest';
import { mergeReadings, parseMeterNumber, ReadingQueue, type KeyValueStore } from './queue';
import type { ReadingJson } from './session';

class MemoryStore implements KeyValueStore {
	items = new Map<string, string>();
	getItem(k: string) {
		return this.items.get(k) ?? null;
	}
	setItem(k: string, v: string) {
		this.items.set(k, v);
	}
	removeItem(k: string) {
		this.items.delete(k);
	}
}

const reading = (clientId: string, takenAt: string, value = 1): ReadingJson => ({ clientId, probeId: 'volts:a:1', outcome: 'value', value, unit: 'V', note: '', takenAt });

describe('offline reading queue', () => {
	it('keeps readings across page loads and drops the ones the server has', () => {
		const store = new MemoryStore();
		new ReadingQueue('d1', store).add(reading('a', '2026-01-01T10:00:00.000Z'));
		new ReadingQueue('d1', store).add(reading('b', '2026-01-01T10:01:00.000Z'));
		// Another diagnosis's queue is its own.
		new ReadingQueue('d2', store).add(reading('c', '2026-01-01T10:02:00.000Z'));
		const q = new ReadingQueue('d1', store);
		expect(q.list().map((r) => r.clientId)).toEqual(['a', 'b']);
		expect(q.list().every((r) => r.queued)).toBe(true);
		expect(q.remove(['a']).map((r) => r.clientId)).toEqual(['b']);
		q.remove(['b']);
		expect(store.items.has('loomwright:queued-readings:d1')).toBe(false);
		expect(new ReadingQueue('d2', store).list()).toHaveLength(1);
	});

	it('adding the same reading twice keeps one', () => {
		const q = new ReadingQueue('d1', new MemoryStore());
		q.add(reading('a', '2026-01-01T10:00:00.000Z', 1));
		expect(q.add(reading('a', '2026-01-01T10:00:00.000Z', 2))).toHaveLength(1);
	});

	it('survives damaged storage', () => {
		const store = new MemoryStore();
		store.setItem('loomwright:queued-readings:d1', '{not json');
		expect(new ReadingQueue('d1', store).list()).toEqual([]);
	});

	it('merges without doubling a reading that reached the server while it was queued', () => {
		const server = [reading('a', '2026-01-01T10:00:00.000Z')];
		const queued = [reading('a', '2026-01-01T10:00:00.000Z'), reading('b', '2026-01-01T09:00:00.000Z')];
		expect(mergeReadings(server, queued).map((r) => r.clientId)).toEqual(['b', 'a']);
	});
});

describe('numbers typed off a meter', () => {
	it.each([
		['12.4', 12.4],
		['-0,35', -0.35],
		['\u221212.1', -12.1],
		[' 0.2 V', 0.2],
		['.5', 0.5],
		['4.7 Ω', 4.7],
		['1e3', 1000]
	])('%s → %d', (text, want) => expect(parseMeterNumber(text)).toBe(want));
	it.each(['', 'abc', '1.2.3', '12 4', '--1'])('"%s" is not a number', (text) => expect(parseMeterNumber(text)).toBeNull());
});
