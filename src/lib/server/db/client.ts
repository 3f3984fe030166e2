// Opening the database is kept free of SvelteKit's $env so that scripts (start, seed, token) and
// the app share it.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import * as schema from './schema';

export type Db = ReturnType<typeof openDb>;

export const DEFAULT_DATABASE_PATH = 'data/wakeline.db';

export function openDb(path: string = DEFAULT_DATABASE_PATH) {
	if (path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
	const sqlite = new Database(path);
	sqlite.pragma('journal_mode = WAL');
	sqlite.pragma('foreign_keys = ON');
	// Concurrent writers (the app and a script) wait for each other instead of failing at once.
	sqlite.pragma('busy_timeout = 5000');
	sqlite.pragma('synchronous = NORMAL');
	return drizzle(sqlite, { schema, casing: 'snake_case' });
}

export function migrateDb(db: Db, migrationsFolder = resolve('drizzle')) {
	// drizzle-kit changes a column in SQLite by rebuilding its table (create, copy, drop, rename); with
	// foreign keys on, the drop would cascade into the child rows. SQLite's own procedure for such
	// changes (sqlite.org/lang_altertable.html, "other kinds of table schema changes"): keys off
	// outside the transaction, migrate, check every reference, keys on again.
	const sqlite = db.$client;
	sqlite.pragma('foreign_keys = OFF');
	try {
		migrate(db, { migrationsFolder });
		const broken = sqlite.pragma('foreign_key_check') as unknown[];
		if (broken.length)
			throw new Error(
				`the migration left ${broken.length} broken references: ${JSON.stringify(broken.slice(0, 5))}`
			);
	} finally {
		sqlite.pragma('foreign_keys = ON');
	}
}
