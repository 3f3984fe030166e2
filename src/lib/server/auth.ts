// Sessions after the Lucia design: a random token in an httpOnly cookie, only its SHA-256 stored,
// 30-day sliding expiry renewed when half used. Passwords hashed with argon2id.
import { hash, verify } from '@node-rs/argon2';
import type { Cookies } from '@sveltejs/kit';
import { and, eq, isNull, ne, sql } from 'drizzle-orm';
import type { Db } from './db/client';
import { prepared } from './db/prepared';
import { apiToken, session, user, type GlobalRole } from './db/schema';
import { hashSecret, newId, newSecret } from './ids';

export const SESSION_COOKIE = 'wl_session';
const DAY_MS = 86_400_000;
const SESSION_LIFETIME_MS = 30 * DAY_MS;
const SESSION_RENEW_MS = 15 * DAY_MS;

export interface SessionUser {
	id: string;
	email: string;
	name: string;
	role: GlobalRole;
	/** Marked by the marine office as allowed to create and lead cruises (admins always are). */
	canLeadCruises: boolean;
}
export interface SessionInfo {
	id: string;
	expiresAt: Date;
	/** 'cookie' for a browser session, 'token' for a personal API token. */
	via: 'cookie' | 'token';
}

// OWASP's argon2id minimum (19 MiB, 2 iterations, 1 lane).
const ARGON2 = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2);
}

export async function verifyPassword(passwordHash: string, password: string): Promise<boolean> {
	try {
		return await verify(passwordHash, password);
	} catch {
		return false;
	}
}

const userColumns = {
	id: user.id,
	email: user.email,
	name: user.name,
	role: user.role,
	canLeadCruises: user.canLeadCruises
};

export function createSession(db: Db, userId: string) {
	const token = newSecret();
	const expiresAt = new Date(Date.now() + SESSION_LIFETIME_MS);
	db.insert(session)
		.values({ id: hashSecret(token), userId, expiresAt })
		.run();
	return { token, expiresAt };
}

export function validateSessionToken(
	db: Db,
	token: string
): { user: SessionUser; session: SessionInfo } | null {
	const id = hashSecret(token);
	const row = prepared(db, 'auth.session', (d) =>
		d
			.select({ user: userColumns, expiresAt: session.expiresAt })
			.from(session)
			.innerJoin(user, eq(session.userId, user.id))
			.where(eq(session.id, sql.placeholder('id')))
			.prepare()
	).get({ id });
	if (!row) return null;
	const now = Date.now();
	if (now >= row.expiresAt.getTime()) {
		db.delete(session).where(eq(session.id, id)).run();
		return null;
	}
	let expiresAt = row.expiresAt;
	if (now >= expiresAt.getTime() - SESSION_RENEW_MS) {
		expiresAt = new Date(now + SESSION_LIFETIME_MS);
		db.update(session).set({ expiresAt }).where(eq(session.id, id)).run();
	}
	return { user: row.user, session: { id, expiresAt, via: 'cookie' } };
}

export function invalidateSession(db: Db, sessionId: string) {
	db.delete(session).where(eq(session.id, sessionId)).run();
}

export function invalidateAllSessions(db: Db, userId: string) {
	db.delete(session).where(eq(session.userId, userId)).run();
}

/** Ends every session of the account except the one given (the person changing their password). */
export function invalidateOtherSessions(db: Db, userId: string, keepSessionId: string) {
	db.delete(session)
		.where(and(eq(session.userId, userId), ne(session.id, keepSessionId)))
		.run();
}

export function setSessionCookie(
	cookies: Cookies,
	token: string,
	expiresAt: Date,
	secure: boolean
) {
	cookies.set(SESSION_COOKIE, token, {
		path: '/',
		httpOnly: true,
		sameSite: 'lax',
		secure,
		expires: expiresAt
	});
}

export function deleteSessionCookie(cookies: Cookies, secure: boolean) {
	cookies.delete(SESSION_COOKIE, { path: '/', httpOnly: true, sameSite: 'lax', secure });
}

// ---------------------------------------------------------------- personal API tokens

export const API_TOKEN_PREFIX = 'wlt_';

/** How finely a token's last use is recorded. */
export const TOKEN_USE_RESOLUTION_MS = 60_000;

export function createApiToken(db: Db, userId: string, name: string) {
	const token = API_TOKEN_PREFIX + newSecret();
	const row = {
		id: newId(),
		userId,
		name,
		tokenHash: hashSecret(token),
		prefix: token.slice(0, API_TOKEN_PREFIX.length + 6)
	};
	db.insert(apiToken).values(row).run();
	return { token, id: row.id };
}

export function validateApiToken(
	db: Db,
	token: string
): { user: SessionUser; session: SessionInfo } | null {
	const tokenHash = hashSecret(token);
	const row = prepared(db, 'auth.token', (d) =>
		d
			.select({ user: userColumns, id: apiToken.id, lastUsedAt: apiToken.lastUsedAt })
			.from(apiToken)
			.innerJoin(user, eq(apiToken.userId, user.id))
			.where(and(eq(apiToken.tokenHash, sql.placeholder('hash')), isNull(apiToken.revokedAt)))
			.prepare()
	).get({ hash: tokenHash });
	if (!row) return null;
	// "Last used" to the minute: a script polling the API does not write on every request (which
	// would also start a new database revision and empty the read caches each time).
	const now = Date.now();
	if (!row.lastUsedAt || now - row.lastUsedAt.getTime() >= TOKEN_USE_RESOLUTION_MS)
		db.update(apiToken)
			.set({ lastUsedAt: new Date(now) })
			.where(eq(apiToken.id, row.id))
			.run();
	return {
		user: row.user,
		session: { id: row.id, expiresAt: new Date(8.64e15), via: 'token' }
	};
}

export function listApiTokens(db: Db, userId: string) {
	return db
		.select({
			id: apiToken.id,
			name: apiToken.name,
			prefix: apiToken.prefix,
			createdAt: apiToken.createdAt,
			lastUsedAt: apiToken.lastUsedAt
		})
		.from(apiToken)
		.where(and(eq(apiToken.userId, userId), isNull(apiToken.revokedAt)))
		.all();
}

export function revokeApiToken(db: Db, userId: string, tokenId: string): boolean {
	const res = db
		.update(apiToken)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiToken.id, tokenId), eq(apiToken.userId, userId), isNull(apiToken.revokedAt)))
		.run();
	return res.changes > 0;
}

/** Revokes every live API token of an account (sign out everywhere, a password reset); returns how many. */
export function revokeAllApiTokens(db: Db, userId: string): number {
	return db
		.update(apiToken)
		.set({ revokedAt: new Date() })
		.where(and(eq(apiToken.userId, userId), isNull(apiToken.revokedAt)))
		.run().changes;
}
