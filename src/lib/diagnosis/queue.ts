// Readings typed while the garage has no network: kept in the browser's storage, per diagnosis,
// until the server has them. Each carries the clientId it was typed with, so sending the queue
// again after a lost answer stores nothing twice (the server ignores a clientId it has).
import type { ReadingJson } from './session';

const PREFIX = 'loomwright:queued-readings:';

export interface KeyValueStore {
	getItem(key: string): string | null;
	setItem(key: string, value: string): void;
	removeItem(key: string): void;
}

export class ReadingQueue {
	constructor(
		private readonly diagnosisId: string,
		private readonly store: KeyValueStore
	) {}

	private get key(): string {
		return PREFIX + this.diagnosisId;
	}

	list(): ReadingJson[] {
		try {
			const raw = this.store.getItem(this.key);
			const parsed = raw ? JSON.parse(raw) : [];
			return Array.isArray(parsed) ? parsed.filter((r) => r && typeof r.clientId === 'string' && typeof r.probeId === 'string') : [];
		} catch {
			return [];
		}
	}

	add(reading: ReadingJson): ReadingJson[] {
		const list = this.list().filter((r) => r.clientId !== reading.clientId);
		list.push({ ...reading, queued: true });
		this.write(list);
		return list;
	}

	/** Drops the readings the server now has (or refused for good). */
	remove(clientIds: Iterable<string>): ReadingJson[] {
		const gone = new Set(clientIds);
		const list = this.list().filter((r) => !gone.has(r.clientId));
		this.write(list);
		return list;
	}

	private write(list: ReadingJson[]): void {
		if (list.length) this.store.setItem(this.key, JSON.stringify(list));
		else this.store.removeItem(this.key);
	}
}

/** Server readings and the queued ones not yet among them, in the order they were taken. */
export function mergeReadings(server: readonly ReadingJson[], queued: readonly ReadingJson[]): ReadingJson[] {
	const have = new Set(server.map((r) => r.clientId));
	return [...server, ...queued.filter((r) => !have.has(r.clientId))].sort((a, b) => (a.takenAt < b.takenAt ? -1 : a.takenAt > b.takenAt ? 1 : 0));
}

/**
 * A number as a person types it off a meter: "12.4", "-0,35" (comma decimals), "−12.1" (a
 * typographic minus), " 0.2 V". Null when it is not a number.
 */
export function parseMeterNumber(text: string): number | null {
	const t = text.trim().replace(/[\u2212\u2013]/g, '-').replace(/\s*(v|volts?|%|ω|ohms?|Ω)$/i, '').replace(',', '.').trim();
	if (!/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return null;
	const n = Number(t);
	return Number.isFinite(n) ? n : null;
}
