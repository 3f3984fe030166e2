// People: sign-in, site invitations, password reset, account changes.
import { and, eq, gt, isNull } from 'drizzle-orm';
import { config } from './config';
import { db } from './db';
import {
	cruiseMember,
	invitation,
	passwordReset,
	user,
	type GlobalRole,
	type User
} from './db/schema';
import {
	hashPassword,
	invalidateAllSessions,
	invalidateOtherSessions,
	listApiTokens,
	revokeAllApiTokens,
	verifyPassword
} from './auth';
import { hashSecret, newId, newSecret } from './ids';
import * as outbox from './mail/outbox';
import * as templates from './mail/templates';
import * as throttle from './throttle';
import { audit } from './audit';

export const RESET_LIFETIME_MINUTES = 60;
export const INVITATION_LIFETIME_DAYS = 14;

export class DomainError extends Error {
	constructor(
		message: string,
		public field?: string,
		public status = 400
	) {
		super(message);
	}
}

export function normaliseEmail(email: string) {
	return email.trim().toLowerCase();
}

export function findByEmail(email: string): User | undefined {
	return db
		.select()
		.from(user)
		.where(eq(user.email, normaliseEmail(email)))
		.get();
}

// A fixed argon2id hash to verify against for unknown e-mails, so timing does not reveal accounts.
let dummyHash: Promise<string> | null = null;

export type SignInResult =
	| { ok: true; user: User }
	| { ok: false; reason: 'invalid' }
	| { ok: false; reason: 'locked'; retryAfterS: number };

export async function signIn(
	email: string,
	password: string,
	address: string
): Promise<SignInResult> {
	const e = normaliseEmail(email);
	// Counted before the password is checked: a parallel burst gets at most the limit of checks.
	const wait = throttle.claimAttempt(db, e, address);
	if (wait > 0) return { ok: false, reason: 'locked', retryAfterS: Math.ceil(wait / 1000) };
	const found = findByEmail(e);
	dummyHash ??= hashPassword('not-a-real-password');
	const valid = found?.passwordHash
		? await verifyPassword(found.passwordHash, password)
		: (await verifyPassword(await dummyHash, password)) && false;
	if (!found || !valid) return { ok: false, reason: 'invalid' };
	throttle.succeeded(db, e, address);
	return { ok: true, user: found };
}

export function list() {
	return db
		.select({
			id: user.id,
			email: user.email,
			name: user.name,
			role: user.role,
			canLeadCruises: user.canLeadCruises,
			createdAt: user.createdAt
		})
		.from(user)
		.orderBy(user.name)
		.all();
}

/** An admin invites someone to the site. Refuses existing accounts and open invitations. */
export function inviteToSite(
	inviter: { id: string; name: string },
	email: string,
	role: GlobalRole
): { id: string; link: string } {
	const e = normaliseEmail(email);
	if (findByEmail(e)) throw new DomainError(`${e} already has an account.`, 'email', 409);
	const open = openInvitation(e, null);
	if (open) throw new DomainError(`${e} already has an open invitation.`, 'email', 409);
	return db.transaction((tx) => {
		const token = newSecret();
		const id = newId();
		tx.insert(invitation)
			.values({
				id,
				email: e,
				globalRole: role,
				tokenHash: hashSecret(token),
				invitedById: inviter.id,
				expiresAt: new Date(Date.now() + INVITATION_LIFETIME_DAYS * 86_400_000)
			})
			.run();
		const link = `${config.origin}/invite/${token}`;
		const mail = templates.siteInvitation({
			inviterName: inviter.name,
			link,
			expiresDays: INVITATION_LIFETIME_DAYS
		});
		outbox.enqueue(tx, { ...mail, to: e, kind: 'invitation' });
		audit(tx, { userId: inviter.id, action: 'invitation.site', detail: { email: e, role } });
		return { id, link };
	});
}

export function openInvitation(email: string, cruiseId: string | null) {
	return db
		.select()
		.from(invitation)
		.where(
			and(
				eq(invitation.email, normaliseEmail(email)),
				cruiseId ? eq(invitation.cruiseId, cruiseId) : isNull(invitation.cruiseId),
				isNull(invitation.acceptedAt),
				isNull(invitation.revokedAt),
				gt(invitation.expiresAt, new Date())
			)
		)
		.get();
}

/** The invitation behind a link, if it can still be used. */
export function invitationByToken(token: string) {
	const row = db
		.select()
		.from(invitation)
		.where(eq(invitation.tokenHash, hashSecret(token)))
		.get();
	if (!row) return { ok: false as const, message: 'This invitation link is not valid.' };
	if (row.acceptedAt)
		return { ok: false as const, message: 'This invitation has already been used.' };
	if (row.revokedAt) return { ok: false as const, message: 'This invitation was withdrawn.' };
	if (row.expiresAt.getTime() <= Date.now())
		return { ok: false as const, message: 'This invitation has expired. Ask for a new one.' };
	return { ok: true as const, invitation: row };
}

/** Accepting creates the account (or reuses it) and, for a cruise invitation, the membership. */
export async function acceptInvitation(
	token: string,
	name: string,
	password: string,
	/** Who is signed in on the browser answering, if anyone. */
	signedInUserId: string | null = null,
	address = 'unknown'
) {
	const found = invitationByToken(token);
	if (!found.ok) throw new DomainError(found.message);
	const inv = found.invitation;
	// An invitation to an address that already has an account never signs anyone in as it: the
	// answer must come from that account signed in, or carry its current password.
	const existing = findByEmail(inv.email);
	if (existing && existing.id !== signedInUserId) {
		// the same attempt limits as the sign-in form: this is a password check too
		const wait = throttle.claimAttempt(db, existing.email, address);
		if (wait > 0)
			throw new DomainError('Too many failed attempts. Try again later.', 'password', 429);
		const ok = existing.passwordHash
			? await verifyPassword(existing.passwordHash, password)
			: false;
		if (!ok)
			throw new DomainError(
				'If this address already has a Wakeline account, sign in to it first or enter its current password.',
				'password'
			);
		throttle.succeeded(db, existing.email, address);
	}
	const passwordHash = await hashPassword(password);
	return db.transaction((tx) => {
		// Single use even under a double submit: only one transaction flips acceptedAt.
		const claimed = tx
			.update(invitation)
			.set({ acceptedAt: new Date() })
			.where(and(eq(invitation.id, inv.id), isNull(invitation.acceptedAt)))
			.run();
		if (claimed.changes === 0) throw new DomainError('This invitation has already been used.');
		let u = tx.select().from(user).where(eq(user.email, inv.email)).get();
		if (!u) {
			u = tx
				.insert(user)
				.values({ id: newId(), email: inv.email, name, passwordHash, role: inv.globalRole })
				.returning()
				.get();
		}
		if (inv.cruiseId && inv.cruiseRole) {
			tx.insert(cruiseMember)
				.values({ cruiseId: inv.cruiseId, userId: u.id, role: inv.cruiseRole })
				.onConflictDoNothing()
				.run();
		}
		audit(tx, { userId: u.id, cruiseId: inv.cruiseId, action: 'invitation.accepted' });
		return u;
	});
}

export class RateLimited extends Error {}

/** Reset mails: at most 3 an hour per address asked for, 10 an hour per client. */
const RESET_WINDOW_MS = 3_600_000;
const RESETS_PER_EMAIL = 3;
const RESETS_PER_CLIENT = 10;
/** Every reset request takes at least this long, so timing cannot tell known from unknown. */
export const RESET_ANSWER_MS = 300;

/**
 * Always answers the same way, whether or not the e-mail has an account, in the same time (the
 * caller awaits the returned promise). Throws RateLimited when the client asked too often; an
 * address asked for too often is silently not mailed again (the answer must not differ).
 */
export async function requestPasswordReset(email: string, client = 'unknown') {
	const started = Date.now();
	try {
		if (!throttle.hit(db, `reset-client:${client}`, RESETS_PER_CLIENT, RESET_WINDOW_MS))
			throw new RateLimited('Too many reset requests from here. Try again in an hour.');
		const e = normaliseEmail(email);
		const u = findByEmail(e);
		if (!throttle.hit(db, `reset-email:${e}`, RESETS_PER_EMAIL, RESET_WINDOW_MS)) return;
		if (u) mailResetLink(u);
	} finally {
		const left = RESET_ANSWER_MS - (Date.now() - started);
		if (left > 0) await new Promise((r) => setTimeout(r, left));
	}
}

function mailResetLink(u: User) {
	db.transaction((tx) => {
		const token = newSecret();
		tx.insert(passwordReset)
			.values({
				id: newId(),
				userId: u.id,
				tokenHash: hashSecret(token),
				expiresAt: new Date(Date.now() + RESET_LIFETIME_MINUTES * 60_000)
			})
			.run();
		const mail = templates.passwordReset({
			link: `${config.origin}/reset/${token}`,
			expiresMinutes: RESET_LIFETIME_MINUTES
		});
		outbox.enqueue(tx, { ...mail, to: u.email, kind: 'password_reset' });
	});
}

export function resetByToken(token: string) {
	const row = db
		.select()
		.from(passwordReset)
		.where(eq(passwordReset.tokenHash, hashSecret(token)))
		.get();
	if (!row) return { ok: false as const, message: 'This reset link is not valid.' };
	if (row.usedAt)
		return {
			ok: false as const,
			message: 'This reset link has already been used. Ask for a new one.'
		};
	if (row.expiresAt.getTime() <= Date.now())
		return { ok: false as const, message: 'This reset link has expired. Ask for a new one.' };
	return { ok: true as const, reset: row };
}

/** The account's live API tokens, by name and prefix only (shown beside the offer to revoke them). */
export function liveTokens(userId: string) {
	return listApiTokens(db, userId).map((t) => ({ name: t.name, prefix: t.prefix }));
}

/**
 * Sets the new password, uses up the link (and every other reset link of the account) and signs the
 * account out everywhere; with `revokeTokens`, its API tokens stop working too.
 */
export async function resetPassword(
	token: string,
	password: string,
	opts: { revokeTokens?: boolean } = {}
) {
	const found = resetByToken(token);
	if (!found.ok) throw new DomainError(found.message);
	const passwordHash = await hashPassword(password);
	db.transaction((tx) => {
		const claimed = tx
			.update(passwordReset)
			.set({ usedAt: new Date() })
			.where(and(eq(passwordReset.id, found.reset.id), isNull(passwordReset.usedAt)))
			.run();
		if (claimed.changes === 0) throw new DomainError('This reset link has already been used.');
		tx.update(user).set({ passwordHash }).where(eq(user.id, found.reset.userId)).run();
		endResetLinks(tx, found.reset.userId);
		audit(tx, { userId: found.reset.userId, action: 'password.reset' });
	});
	invalidateAllSessions(db, found.reset.userId);
	if (opts.revokeTokens) revokeAllApiTokens(db, found.reset.userId);
	return found.reset.userId;
}

/** Outstanding reset links of an account stop working (a new password makes them stale). */
function endResetLinks(tx: Pick<typeof db, 'update'>, userId: string) {
	tx.update(passwordReset)
		.set({ usedAt: new Date() })
		.where(and(eq(passwordReset.userId, userId), isNull(passwordReset.usedAt)))
		.run();
}

/**
 * A new password ends the account's other sessions and its outstanding reset links; the session
 * that changed it stays signed in.
 */
export async function changePassword(
	userId: string,
	current: string,
	next: string,
	keepSessionId?: string
) {
	const u = db.select().from(user).where(eq(user.id, userId)).get();
	if (!u?.passwordHash || !(await verifyPassword(u.passwordHash, current)))
		throw new DomainError('The current password is not right.', 'currentPassword');
	const passwordHash = await hashPassword(next);
	db.transaction((tx) => {
		tx.update(user).set({ passwordHash }).where(eq(user.id, userId)).run();
		endResetLinks(tx, userId);
		audit(tx, { userId, action: 'password.changed' });
	});
	if (keepSessionId) invalidateOtherSessions(db, userId, keepSessionId);
	else invalidateAllSessions(db, userId);
}

export function rename(userId: string, name: string) {
	db.update(user).set({ name }).where(eq(user.id, userId)).run();
}

/** The marine office allows (or stops) a member to create and lead cruises. */
export function setCanLeadCruises(actorId: string, userId: string, allowed: boolean) {
	const res = db.update(user).set({ canLeadCruises: allowed }).where(eq(user.id, userId)).run();
	if (res.changes === 0) throw new DomainError('No such person.', 'userId', 404);
	audit(db, { userId: actorId, action: 'user.can_lead', detail: { userId, allowed } });
}
