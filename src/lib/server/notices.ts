// Notices to people: the one door every flow uses to mail a user (schedule publications, berth
// decisions, invoices and receipts, reminders). It goes through the outbox inside the caller's
// transaction, skips optional kinds a user has turned off, never queues the same dedupeKey twice,
// and gives optional kinds a one-click unsubscribe (RFC 8058). Mail never carries medical
// information or documents: there is no way to attach anything but a schedule calendar.
import { and, desc, eq } from 'drizzle-orm';
import { ApiError } from './api';
import { config } from './config';
import { db as appDb } from './db';
import type { Db } from './db/client';
import { notice, noticePreference, unsubscribeToken, user } from './db/schema';
import { hashSecret, newId, newSecret } from './ids';
import * as outbox from './mail/outbox';
import { escapeHtml, textToHtml } from './mail/templates';

type Reader = Pick<Db, 'select'>;
type Writer = Pick<Db, 'select' | 'insert' | 'update'>;

/** Kinds a user may turn off. Everything else (schedule publications above all) always goes out. */
export const OPTIONAL_KINDS = ['reminder', 'digest'] as const;
export type OptionalKind = (typeof OPTIONAL_KINDS)[number];

export const OPTIONAL_LABELS: Record<OptionalKind, { title: string; hint: string }> = {
	reminder: {
		title: 'Reminders',
		hint: 'Documents and clearances falling due: 14, 7 and 1 days before.'
	},
	digest: { title: 'Digests', hint: 'Summaries of what changed on your cruises.' }
};

/** Kinds the other flows use; free text is allowed too, these are the ones Wakeline knows. */
export const KINDS = {
	schedule: 'Schedule published',
	berth_decision: 'Berth decision',
	berth_offer: 'Berth offered',
	invoice_issued: 'Invoice issued',
	payment_receipt: 'Payment receipt',
	reminder: 'Reminder',
	digest: 'Digest'
} as const;

export function isOptional(kind: string): kind is OptionalKind {
	return (OPTIONAL_KINDS as readonly string[]).includes(kind);
}

export interface NoticeInput {
	kind: string;
	/** The recipient; the address is read from the account. */
	userId: string;
	cruiseId?: string | null;
	subject: string;
	text: string;
	/** A full HTML document; made from the text when left out. */
	html?: string;
	/** iCalendar text (method PUBLISH) for schedule items — the only attachment a notice may carry. */
	ics?: string;
	/** The same key is never queued twice, e.g. `invoice-issued:<invoiceId>:<userId>`. */
	dedupeKey?: string;
}

const MAX_SUBJECT = 200;
const MAX_TEXT = 100_000;

/**
 * Queues a notice for one user inside the caller's transaction. Returns the notice id, or null
 * when nothing was queued: no such user, an optional kind the user has turned off, or a notice
 * with the same dedupeKey already exists.
 */
export function send(tx: Writer, n: NoticeInput): string | null {
	if (!n.subject.trim() || n.subject.length > MAX_SUBJECT)
		throw new Error(`A notice subject must be 1–${MAX_SUBJECT} characters.`);
	if (n.text.length > MAX_TEXT) throw new Error(`A notice text is limited to ${MAX_TEXT} chars.`);
	const to = tx
		.select({ id: user.id, email: user.email })
		.from(user)
		.where(eq(user.id, n.userId))
		.get();
	if (!to) return null;
	if (n.dedupeKey) {
		const seen = tx
			.select({ id: notice.id })
			.from(notice)
			.where(eq(notice.dedupeKey, n.dedupeKey))
			.get();
		if (seen) return null;
	}
	let text = n.text;
	let html = n.html ?? textToHtml(n.text);
	let headers: Record<string, string> | null = null;
	if (isOptional(n.kind)) {
		if (!wants(tx, n.userId, n.kind)) return null;
		const link = unsubscribeLink(tx, n.userId, n.kind);
		// RFC 8058 §3.1: an HTTPS URI in List-Unsubscribe plus the one-click marker header.
		headers = {
			'List-Unsubscribe': `<${link}>`,
			'List-Unsubscribe-Post': 'List-Unsubscribe=One-Click'
		};
		const label = OPTIONAL_LABELS[n.kind].title.toLowerCase();
		text += `\n\nNo more ${label}? Turn them off with one click: ${link}`;
		html = html.replace(
			/<\/body>/,
			`<p style="color:#666;font-size:12px">No more ${escapeHtml(label)}? <a href="${link}">Turn them off</a> (one click, no sign-in).</p></body>`
		);
	}
	return outbox.enqueue(tx, {
		to: to.email,
		userId: to.id,
		cruiseId: n.cruiseId ?? null,
		kind: n.kind,
		subject: n.subject,
		text,
		html,
		ics: n.ics,
		dedupeKey: n.dedupeKey ?? null,
		headers
	});
}

// ---------------------------------------------------------------- preferences

export function wants(d: Reader, userId: string, kind: OptionalKind): boolean {
	const row = d
		.select({ enabled: noticePreference.enabled })
		.from(noticePreference)
		.where(and(eq(noticePreference.userId, userId), eq(noticePreference.kind, kind)))
		.get();
	return row?.enabled ?? true;
}

export function preferences(userId: string, d: Reader = appDb): Record<OptionalKind, boolean> {
	return Object.fromEntries(OPTIONAL_KINDS.map((k) => [k, wants(d, userId, k)])) as Record<
		OptionalKind,
		boolean
	>;
}

export function setPreference(
	userId: string,
	kind: OptionalKind,
	enabled: boolean,
	d: Pick<Db, 'insert'> = appDb
) {
	d.insert(noticePreference)
		.values({ userId, kind, enabled, updatedAt: new Date() })
		.onConflictDoUpdate({
			target: [noticePreference.userId, noticePreference.kind],
			set: { enabled, updatedAt: new Date() }
		})
		.run();
}

// ---------------------------------------------------------------- one-click unsubscribe

function unsubscribeLink(tx: Pick<Db, 'insert'>, userId: string, kind: OptionalKind): string {
	const token = newSecret();
	tx.insert(unsubscribeToken)
		.values({ id: newId(), tokenHash: hashSecret(token), userId, kind })
		.run();
	return `${config.origin}/unsubscribe/${token}`;
}

export interface UnsubscribeView {
	kind: OptionalKind;
	label: string;
	/** The address, partly hidden: the link may have been forwarded. */
	maskedEmail: string;
	used: boolean;
}

function mask(email: string): string {
	const [local, domain] = email.split('@');
	return `${local.slice(0, 2)}${'•'.repeat(Math.max(1, local.length - 2))}@${domain}`;
}

const TOKEN_RE = /^[a-z2-7]{20,40}$/;

/** What a link would turn off, for the confirmation page. Null for a link that does not exist. */
export function peekUnsubscribe(token: string, d: Reader = appDb): UnsubscribeView | null {
	if (!TOKEN_RE.test(token)) return null;
	const row = d
		.select({ kind: unsubscribeToken.kind, usedAt: unsubscribeToken.usedAt, email: user.email })
		.from(unsubscribeToken)
		.innerJoin(user, eq(user.id, unsubscribeToken.userId))
		.where(eq(unsubscribeToken.tokenHash, hashSecret(token)))
		.get();
	if (!row || !isOptional(row.kind)) return null;
	return {
		kind: row.kind,
		label: OPTIONAL_LABELS[row.kind].title,
		maskedEmail: mask(row.email),
		used: row.usedAt != null
	};
}

/**
 * Turns off the one preference the link names. Works once: 404 for an unknown link, 410 for a
 * used one. No session needed — the single-use token is the credential.
 */
export function unsubscribe(token: string, d: Db = appDb): UnsubscribeView {
	if (!TOKEN_RE.test(token)) throw new ApiError(404, 'This unsubscribe link is not valid.');
	return d.transaction((tx) => {
		const row = tx
			.select()
			.from(unsubscribeToken)
			.where(eq(unsubscribeToken.tokenHash, hashSecret(token)))
			.get();
		if (!row || !isOptional(row.kind))
			throw new ApiError(404, 'This unsubscribe link is not valid.');
		if (row.usedAt) throw new ApiError(410, 'This unsubscribe link was already used.', 'gone');
		const used = tx
			.update(unsubscribeToken)
			.set({ usedAt: new Date() })
			.where(and(eq(unsubscribeToken.id, row.id)))
			.run();
		if (used.changes !== 1) throw new ApiError(410, 'This unsubscribe link was already used.');
		setPreference(row.userId, row.kind, false, tx);
		const email = tx.select({ email: user.email }).from(user).where(eq(user.id, row.userId)).get();
		return {
			kind: row.kind,
			label: OPTIONAL_LABELS[row.kind].title,
			maskedEmail: mask(email?.email ?? '?@?'),
			used: true
		};
	});
}

// ---------------------------------------------------------------- the notice log

export interface LogEntry {
	id: string;
	kind: string;
	toAddress: string;
	subject: string;
	status: 'queued' | 'sent' | 'failed';
	attempts: number;
	createdAt: Date;
	sentAt: Date | null;
	/** When the next try is due (queued only). */
	nextAttemptAt: Date | null;
	lastError: string | null;
}

/** What went to whom for one cruise, newest first. */
export function log(cruiseId: string, limit = 500, d: Reader = appDb): LogEntry[] {
	return d
		.select({
			id: notice.id,
			kind: notice.kind,
			toAddress: notice.toAddress,
			subject: notice.subject,
			status: notice.status,
			attempts: notice.attempts,
			createdAt: notice.createdAt,
			sentAt: notice.sentAt,
			nextAttemptAt: notice.nextAttemptAt,
			lastError: notice.lastError
		})
		.from(notice)
		.where(eq(notice.cruiseId, cruiseId))
		.orderBy(desc(notice.createdAt))
		.limit(limit)
		.all()
		.map((r) => ({ ...r, nextAttemptAt: r.status === 'queued' ? r.nextAttemptAt : null }));
}
