/**
 * Reads kept between requests, each filed under the project it shows, so a
 * page seen again needs no round trip to PostgreSQL. An entry goes as soon
 * as its project (or everything) is said to have changed; a read that was
 * under way while any change was announced is handed out but not kept, so a
 * late answer never overwrites news. Kept values are frozen: a caller that
 * tried to change one would change it for every later reader, and fails
 * loudly instead. No I/O here; db/cached-reads.ts wires it to the database.
 */
interface Entry {
	value: unknown;
	projectId: string;
}

export class ProjectReadCache {
	readonly #entries = new Map<string, Entry>();
	/** Moves on every forgetting: a read that began before a change must not be kept. */
	#epoch = 0;

	/**
	 * @param capacity most entries kept; the least recently used goes first
	 * @param usable whether entries may be used and kept right now (for example: the change feed is listening)
	 */
	constructor(
		readonly capacity: number,
		private readonly usable: () => boolean
	) {}

	async read<T extends object>(key: string, load: () => Promise<T | undefined>, projectOf: (value: T) => string): Promise<T | undefined> {
		if (!this.usable()) return load();
		const kept = this.#entries.get(key);
		if (kept) {
			// Most recently used last: Map keeps insertion order.
			this.#entries.delete(key);
			this.#entries.set(key, kept);
			return kept.value as T;
		}
		const epoch = this.#epoch;
		const value = await load();
		if (value !== undefined && epoch === this.#epoch && this.usable()) {
			this.#entries.set(key, { value: deepFreeze(value), projectId: projectOf(value) });
			if (this.#entries.size > this.capacity) this.#entries.delete(this.#entries.keys().next().value as string);
		}
		return value;
	}

	forgetProject(projectId: string): void {
		this.#epoch++;
		for (const [key, entry] of this.#entries) if (entry.projectId === projectId) this.#entries.delete(key);
	}

	forgetAll(): void {
		this.#epoch++;
		this.#entries.clear();
	}

	get size(): number {
		return this.#entries.size;
	}
}

function deepFreeze<T>(value: T): T {
	if (value === null || typeof value !== 'object' || Object.isFrozen(value) || ArrayBuffer.isView(value)) return value;
	Object.freeze(value);
	for (const inner of Object.values(value)) deepFreeze(inner);
	return value;
}
