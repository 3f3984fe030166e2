// A cheap token that changes whenever the database's content may have changed, for caches of
// values read from it (the timeline build, the plan collection). SQLite gives two counters:
// `total_changes()` counts the rows this connection has inserted, updated or deleted since it was
// opened, and `PRAGMA data_version` changes when another connection (a script, a second process)
// commits (sqlite.org/c3ref/total_changes.html, sqlite.org/pragma.html#pragma_data_version). Between
// two equal tokens nothing was written, so anything computed from the database still holds. Any
// write, however unrelated, starts a new revision: a cache keyed on it may recompute more often than
// needed but never serves stale data.
import type { Statement } from 'better-sqlite3';
import type { Db } from './client';

const probes = new WeakMap<Db['$client'], { version: Statement; changes: Statement }>();

export function revision(db: Db): string {
	const sqlite = db.$client;
	let p = probes.get(sqlite);
	if (!p) {
		p = {
			version: sqlite.prepare('PRAGMA data_version').pluck(),
			changes: sqlite.prepare('SELECT total_changes()').pluck()
		};
		probes.set(sqlite, p);
	}
	return `${p.version.get()}.${p.changes.get()}`;
}

/**
 * A small least-recently-used memo of values computed from the database, each valid for the
 * revision it was computed at. Values must be treated as read-only by every caller.
 */
export class RevisionMemo<T> {
	private entries = new Map<string, { rev: string; value: T }>();
	constructor(private readonly max = 64) {}

	get(db: Db, key: string, compute: () => T): T {
		const rev = revision(db);
		const hit = this.entries.get(key);
		if (hit && hit.rev === rev) {
			this.entries.delete(key);
			this.entries.set(key, hit);
			return hit.value;
		}
		// Keyed by the revision read before computing: what the computation reads is what the
		// database held then. If the computation itself writes, the next reader recomputes once.
		const value = compute();
		this.entries.delete(key);
		const entry = { rev, value };
		this.entries.set(key, entry);
		// A failed asynchronous computation is not kept.
		if (value instanceof Promise)
			value.catch(() => {
				if (this.entries.get(key) === entry) this.entries.delete(key);
			});
		if (this.entries.size > this.max) this.entries.delete(this.entries.keys().next().value!);
		return value;
	}

	/** Whether a value for the key is held for the database's current revision. */
	has(db: Db, key: string): boolean {
		return this.entries.get(key)?.rev === revision(db);
	}

	clear() {
		this.entries.clear();
	}
}
