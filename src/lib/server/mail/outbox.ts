// The mail outbox. Callers enqueue inside their own transaction (after the change is decided);
// the worker delivers over SMTP and retries with exponential backoff, so a mail server that is down
// loses nothing. After MAX_ATTEMPTS a message is marked failed and shown to admins, who can retry it
// at once; a message that failed only because the server could not be reached goes out again by
// itself as soon as the server answers. A refusal the server calls permanent (RFC 5321 reply code
// 5yz, e.g. an unknown mailbox) is not retried on its own.
import { and, asc, desc, eq, inArray, lte, not, like } from 'drizzle-orm';
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import { db as appDb } from '../db';
import type { Db } from '../db/client';
import { notice } from '../db/schema';
import { newId } from '../ids';
import { RESET_LIFETIME_MINUTES } from '../users';
import { textToHtml } from './templates';

export const MAX_ATTEMPTS = 8;
/** lastError prefix of a refusal the mail server called permanent (reply code 5yz). */
export const PERMANENT = '[permanent] ';
/** How long the link in a message of this kind works, if it expires (read at call time: users.ts imports this module). */
const linkLifetimeMs = (kind: string): number | undefined =>
	kind === 'password_reset' ? RESET_LIFETIME_MINUTES * 60_000 : undefined;
const BASE_BACKOFF_MS = 30_000;
const MAX_BACKOFF_MS = 3_600_000;

export interface OutgoingMail {
	to: string;
	subject: string;
	text: string;
	html?: string;
	/** iCalendar text, attached as invite.ics (schedule items only). */
	ics?: string;
	kind: string;
	cruiseId?: string | null;
	/** The recipient's account, for the notice log and preferences. */
	userId?: string | null;
	/** A second enqueue with the same key is ignored (returns null). */
	dedupeKey?: string | null;
	/** Extra headers, e.g. RFC 8058 List-Unsubscribe. */
	headers?: Record<string, string> | null;
}

type Tx = Pick<Db, 'insert'>;

/** Queues a mail; returns its id, or null when one with the same dedupeKey is already there. */
export function enqueue(tx: Tx, mail: OutgoingMail): string | null {
	const id = newId();
	const res = tx
		.insert(notice)
		.values({
			id,
			cruiseId: mail.cruiseId ?? null,
			kind: mail.kind,
			toAddress: mail.to,
			subject: mail.subject,
			text: mail.text,
			html: mail.html ?? null,
			icsAttachment: mail.ics ?? null,
			userId: mail.userId ?? null,
			dedupeKey: mail.dedupeKey ?? null,
			headers: mail.headers ?? null,
			nextAttemptAt: new Date()
		})
		.onConflictDoNothing({ target: notice.dedupeKey })
		.run();
	if (res.changes === 0) return null;
	kick();
	return id;
}

export function backoffMs(attempts: number): number {
	return Math.min(MAX_BACKOFF_MS, BASE_BACKOFF_MS * 2 ** Math.max(0, attempts - 1));
}

let transporter: Transporter | null = null;
function transport(): Transporter {
	transporter ??= nodemailer.createTransport(config.smtpUrl || 'smtp://127.0.0.1:2525');
	return transporter;
}

/** Test hook: point the worker at another SMTP server. */
export function useTransport(t: Transporter | null) {
	transporter = t;
}

let sweeping: Promise<number> | null = null;

/** Delivers every due message once. Returns how many were sent. */
export function sweep(db: Db = appDb, now = new Date()): Promise<number> {
	sweeping ??= doSweep(db, now).finally(() => {
		sweeping = null;
	});
	return sweeping;
}

async function doSweep(db: Db, now: Date): Promise<number> {
	const due = db
		.select()
		.from(notice)
		.where(and(eq(notice.status, 'queued'), lte(notice.nextAttemptAt, now)))
		.orderBy(asc(notice.nextAttemptAt))
		.limit(50)
		.all();
	let sent = 0;
	for (const m of due) {
		// A link that expired while the message waited is not sent as if it worked.
		const lifetime = linkLifetimeMs(m.kind);
		const stale = lifetime !== undefined && now.getTime() - m.createdAt.getTime() > lifetime;
		const text = stale ? expiredText(m.subject) : m.text;
		try {
			const info = await transport().sendMail({
				from: config.mailFrom,
				to: m.toAddress,
				subject: stale ? `${m.subject} (link expired)` : m.subject,
				text,
				// Every mail has an HTML part beside the plain text.
				html: stale ? textToHtml(text) : (m.html ?? textToHtml(m.text)),
				headers: m.headers ?? undefined,
				icalEvent: m.icsAttachment
					? { filename: 'schedule.ics', method: 'PUBLISH', content: m.icsAttachment }
					: undefined
			});
			db.update(notice)
				.set({
					status: 'sent',
					attempts: m.attempts + 1,
					sentAt: new Date(),
					messageId: info.messageId,
					lastError: null
				})
				.where(eq(notice.id, m.id))
				.run();
			sent++;
		} catch (e) {
			const attempts = m.attempts + 1;
			const code = (e as { responseCode?: number }).responseCode ?? 0;
			const permanent = code >= 500 && code < 600;
			db.update(notice)
				.set({
					attempts,
					lastError: ((permanent ? PERMANENT : '') + (e as Error).message).slice(0, 500),
					status: permanent || attempts >= MAX_ATTEMPTS ? 'failed' : 'queued',
					nextAttemptAt: new Date(Date.now() + backoffMs(attempts))
				})
				.where(eq(notice.id, m.id))
				.run();
		}
	}
	// The server answered: what was given up while it could not be reached goes out again.
	if (sent > 0)
		requeue(db, and(eq(notice.status, 'failed'), not(like(notice.lastError, `${PERMANENT}%`))));
	return sent;
}

function expiredText(subject: string): string {
	return (
		`This message ("${subject}") could not be delivered while its link still worked, so the link ` +
		`is left out. Ask for a new one at ${config.origin}/reset.`
	);
}

function requeue(db: Db, where: ReturnType<typeof and>): number {
	return db
		.update(notice)
		.set({ status: 'queued', attempts: 0, nextAttemptAt: new Date() })
		.where(where)
		.run().changes;
}

/** Admin "retry now": the given failed (or waiting) messages are sent at the next sweep. */
export function retryNow(ids: string[], db: Db = appDb): number {
	if (!ids.length) return 0;
	const n = requeue(db, and(inArray(notice.id, ids), inArray(notice.status, ['failed', 'queued'])));
	kick();
	return n;
}

/** The newest messages for the admins' outbox list. */
export function recent(limit = 100, db: Db = appDb) {
	return db
		.select({
			id: notice.id,
			kind: notice.kind,
			toAddress: notice.toAddress,
			subject: notice.subject,
			status: notice.status,
			attempts: notice.attempts,
			lastError: notice.lastError,
			createdAt: notice.createdAt,
			sentAt: notice.sentAt,
			nextAttemptAt: notice.nextAttemptAt
		})
		.from(notice)
		.orderBy(desc(notice.createdAt))
		.limit(limit)
		.all();
}

let timer: ReturnType<typeof setInterval> | null = null;
let kickTimer: ReturnType<typeof setTimeout> | null = null;

export function startWorker() {
	if (timer) return;
	timer = setInterval(() => void sweep().catch(logSweepError), config.outboxIntervalMs);
	timer.unref?.();
	kick();
}

/** Sends soon after an enqueue instead of waiting for the next sweep. */
function kick() {
	if (!timer || kickTimer) return;
	kickTimer = setTimeout(() => {
		kickTimer = null;
		void sweep().catch(logSweepError);
	}, 50);
}

function logSweepError(e: unknown) {
	console.error('[outbox] sweep failed', e);
}
