// Sign-in attempts are counted per account and per client address in a window; past the limit the
// key is locked for a while. Each attempt is counted (claimAttempt) in one synchronous transaction
// BEFORE its password is checked, so a parallel burst cannot get more checks than the limit; a
// successful sign-in then gives its attempt back (succeeded).
import { eq } from 'drizzle-orm';
import { config } from './config';
import type { Db } from './db/client';
import { signInThrottle } from './db/schema';

export function keysFor(email: string, address: string) {
	return [`account:${email.toLowerCase()}`, `address:${address}`];
}

/**
 * Counts one attempt on every key, atomically with the lock check (better-sqlite3 is synchronous:
 * nothing else runs between the read and the write). Returns 0 when the attempt may be evaluated,
 * else the milliseconds until the keys unlock (and counts nothing).
 */
export function claimAttempt(db: Db, email: string, address: string, now = Date.now()): number {
	const { windowMs, maxPerAccount, maxPerAddress, lockMs } = config.signIn;
	const [accountKey, addressKey] = keysFor(email, address);
	return db.transaction((tx) => {
		const rows = (
			[
				[accountKey, maxPerAccount],
				[addressKey, maxPerAddress]
			] as const
		).map(([key, max]) => ({
			key,
			max,
			row: tx.select().from(signInThrottle).where(eq(signInThrottle.key, key)).get()
		}));
		let wait = 0;
		for (const { row } of rows) {
			const until = row?.lockedUntil?.getTime() ?? 0;
			if (until > now) wait = Math.max(wait, until - now);
		}
		if (wait > 0) return wait;
		for (const { key, max, row } of rows) {
			const fresh = !row || now - row.windowStartedAt.getTime() > windowMs;
			const failures = fresh ? 1 : row.failures + 1;
			const values = {
				failures,
				windowStartedAt: fresh ? new Date(now) : row.windowStartedAt,
				// the attempt that reaches the limit is still evaluated; the next ones are not
				lockedUntil: failures >= max ? new Date(now + lockMs) : null
			};
			tx.insert(signInThrottle)
				.values({ key, ...values })
				.onConflictDoUpdate({ target: signInThrottle.key, set: values })
				.run();
		}
		return 0;
	});
}

/** A claimed attempt succeeded: the account starts afresh and the address gets its attempt back. */
export function succeeded(db: Db, email: string, address: string) {
	const { maxPerAddress } = config.signIn;
	const [accountKey, addressKey] = keysFor(email, address);
	db.transaction((tx) => {
		tx.delete(signInThrottle).where(eq(signInThrottle.key, accountKey)).run();
		const row = tx.select().from(signInThrottle).where(eq(signInThrottle.key, addressKey)).get();
		if (!row) return;
		const failures = Math.max(0, row.failures - 1);
		tx.update(signInThrottle)
			.set({ failures, lockedUntil: failures >= maxPerAddress ? row.lockedUntil : null })
			.where(eq(signInThrottle.key, addressKey))
			.run();
	});
}

/**
 * Counts one use of `key` in a window of `windowMs`; false when it is over `max` (and then counts
 * nothing). For rate limits that are not sign-ins, e.g. reset mails per address and per client.
 */
export function hit(db: Db, key: string, max: number, windowMs: number, now = Date.now()): boolean {
	return db.transaction((tx) => {
		const row = tx.select().from(signInThrottle).where(eq(signInThrottle.key, key)).get();
		const fresh = !row || now - row.windowStartedAt.getTime() > windowMs;
		const count = fresh ? 1 : row.failures + 1;
		if (count > max) return false;
		const values = {
			failures: count,
			windowStartedAt: fresh ? new Date(now) : row.windowStartedAt
		};
		tx.insert(signInThrottle)
			.values({ key, ...values, lockedUntil: null })
			.onConflictDoUpdate({ target: signInThrottle.key, set: values })
			.run();
		return true;
	});
}
