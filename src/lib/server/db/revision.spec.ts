import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { openDb, type Db } from './client';
import { revision, RevisionMemo } from './revision';

let dir = '';
const open: Db[] = [];
function twoConnections() {
	dir = mkdtempSync(join(tmpdir(), 'wl-rev-'));
	const path = join(dir, 'r.db');
	const a = openDb(path);
	a.$client.exec('CREATE TABLE t (x INTEGER)');
	const b = openDb(path);
	open.push(a, b);
	return { a, b };
}
afterEach(() => {
	for (const d of open.splice(0)) d.$client.close();
	if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('revision', () => {
	it('stays put while nothing is written and moves on a write of this connection or another', () => {
		const { a, b } = twoConnections();
		const r0 = revision(a);
		a.$client.prepare('SELECT * FROM t').all();
		expect(revision(a)).toBe(r0);
		a.$client.exec('INSERT INTO t VALUES (1)');
		const r1 = revision(a);
		expect(r1).not.toBe(r0);
		// A commit by another connection (a script, a second process) is seen too.
		b.$client.exec('INSERT INTO t VALUES (2)');
		expect(revision(a)).not.toBe(r1);
	});

	it('an update that changes no row is not a new revision', () => {
		const { a } = twoConnections();
		const r0 = revision(a);
		a.$client.exec('UPDATE t SET x = 3 WHERE x = 99');
		expect(revision(a)).toBe(r0);
	});
});

describe('RevisionMemo', () => {
	it('computes once per revision and again after any write', () => {
		const { a } = twoConnections();
		const memo = new RevisionMemo<number>();
		let runs = 0;
		const count = () => {
			runs++;
			return a.$client.prepare('SELECT count(*) FROM t').pluck().get() as number;
		};
		expect(memo.get(a, 'k', count)).toBe(0);
		expect(memo.get(a, 'k', count)).toBe(0);
		expect(runs).toBe(1);
		expect(memo.has(a, 'k')).toBe(true);
		a.$client.exec('INSERT INTO t VALUES (1)');
		expect(memo.has(a, 'k')).toBe(false);
		expect(memo.get(a, 'k', count)).toBe(1);
		expect(runs).toBe(2);
	});

	it('does not keep a failed asynchronous computation', async () => {
		const { a } = twoConnections();
		const memo = new RevisionMemo<Promise<number>>();
		await expect(memo.get(a, 'k', () => Promise.reject(new Error('busy')))).rejects.toThrow();
		await expect(memo.get(a, 'k', () => Promise.resolve(7))).resolves.toBe(7);
	});

	it('holds at most its bound, dropping the least recently used', () => {
		const { a } = twoConnections();
		const memo = new RevisionMemo<string>(2);
		memo.get(a, 'x', () => 'x');
		memo.get(a, 'y', () => 'y');
		memo.get(a, 'x', () => 'x');
		memo.get(a, 'z', () => 'z');
		expect(memo.has(a, 'x')).toBe(true);
		expect(memo.has(a, 'y')).toBe(false);
		expect(memo.has(a, 'z')).toBe(true);
	});
});
