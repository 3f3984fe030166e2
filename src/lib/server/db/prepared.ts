// Statements the server runs on every request (who is calling, their role on the cruise), built and
// prepared once per database connection instead of on every call: drizzle's query building and
// SQLite's statement preparation were most of a request's time under load (`npm run load`).
// Use `sql.placeholder(name)` in the query and pass the values to `.get({ name: value })`.
import type { Db } from './client';

const byDb = new WeakMap<Db['$client'], Map<string, unknown>>();

export function prepared<T>(db: Db, name: string, make: (db: Db) => T): T {
	let m = byDb.get(db.$client);
	if (!m) byDb.set(db.$client, (m = new Map()));
	let p = m.get(name) as T | undefined;
	if (p === undefined) m.set(name, (p = make(db)));
	return p;
}
