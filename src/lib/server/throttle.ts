// Failed sign-ins are counted per account and per client address in a window; past the limit the
// key is locked for a while. Successful sign-in clears the account's count.
import { eq } from 'drizzle-orm';
import { config } from './config';
import type { Db } from './db/client';
import { signInThrottle } from './db/schema';

export function keysFor(email: string, address: string) {
	return [`account:${email.toLowerCase()}`, `address:${address}`];
}

/** Milliseconds until the first of the keys is unlocked, or 0 when none is locked. */
export function lockedFor(db: Db, keys: string[], now = Date.now()): number {
	let wait = 0;
	for (const key of keys) {
		const row = db.select().from(signInThrottle).where(eq(signInThrottle.key, key)).get();
		const until = row?.lockedUntil?.getTime() ?? 0;
		if (until > now) wait = Math.max(wait, until - now);
	}
	return wait;
}

export function recordFailure(db: Db, email: string, address: string, now = Date.now()) {
	const { windowMs, maxPerAccount, maxPerAddress, lockMs } = config.signIn;
	const [accountKey, addressKey] = keysFor(email, address);
	for (const [key, max] of [
		[accountKey, maxPerAccount],
		[addressKey, maxPerAddress]
	] as const) {
		const row = db.select().from(signInThrottle).where(eq(signInThrottle.key, key)).get();
		const fresh = !row || now - row.windowStartedAt.getTime() > windowMs;
		const failures = fresh ? 1 : row.failures + 1;
		const values = {
			failures,
			windowStartedAt: fresh ? new Date(now) : row.windowStartedAt,
			lockedUntil: failures >= max ? new Date(now + lockMs) : (row?.lockedUntil ?? null)
		};
		db.insert(signInThrottle)
			.values({ key, ...values })
			.onConflictDoUpdate({ target: signInThrottle.key, set: values })
			.run();
	}
}

export function clearAccount(db: Db, email: string) {
	db.delete(signInThrottle)
		.where(eq(signInThrottle.key, `account:${email.toLowerCase()}`))
		.run();
}
