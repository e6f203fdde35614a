// Plans kept in memory: a plan is a pure function of what it is made from (the drawing at one
// revision, the scenario, marks, meter, uncertainty and readings), so the key names all of that
// and a kept plan is never stale. Bounded (least recently used goes first); concurrent requests
// for one key share one run.
export class PlanCache<T> {
	private kept = new Map<string, T>();
	private running = new Map<string, Promise<T>>();

	constructor(private readonly size = 64) {}

	get(key: string): T | undefined {
		const hit = this.kept.get(key);
		if (hit !== undefined) {
			this.kept.delete(key);
			this.kept.set(key, hit);
		}
		return hit;
	}

	set(key: string, value: T): void {
		this.kept.delete(key);
		this.kept.set(key, value);
		if (this.kept.size > this.size) this.kept.delete(this.kept.keys().next().value!);
	}

	/** The kept value, the run already under way for the key, or a new run (kept once it succeeds). */
	getOrMake(key: string | null, make: () => Promise<T>): Promise<T> {
		if (!key) return make();
		const hit = this.get(key);
		if (hit !== undefined) return Promise.resolve(hit);
		const inFlight = this.running.get(key);
		if (inFlight) return inFlight;
		const made = make()
			.then((value) => {
				this.set(key, value);
				return value;
			})
			.finally(() => this.running.delete(key));
		this.running.set(key, made);
		return made;
	}
}
