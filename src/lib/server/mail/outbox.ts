// The mail outbox. Callers enqueue inside their own transaction (after the change is decided);
// the worker delivers over SMTP and retries with exponential backoff, so a mail server that is down
// loses nothing. After MAX_ATTEMPTS a message is marked failed and shown to admins.
import { and, asc, eq, lte } from 'drizzle-orm';
import nodemailer, { type Transporter } from 'nodemailer';
import { config } from '../config';
import { db as appDb } from '../db';
import type { Db } from '../db/client';
import { notice } from '../db/schema';
import { newId } from '../ids';
import { textToHtml } from './templates';

export const MAX_ATTEMPTS = 8;
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
		try {
			const info = await transport().sendMail({
				from: config.mailFrom,
				to: m.toAddress,
				subject: m.subject,
				text: m.text,
				// Every mail has an HTML part beside the plain text.
				html: m.html ?? textToHtml(m.text),
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
			db.update(notice)
				.set({
					attempts,
					lastError: (e as Error).message.slice(0, 500),
					status: attempts >= MAX_ATTEMPTS ? 'failed' : 'queued',
					nextAttemptAt: new Date(Date.now() + backoffMs(attempts))
				})
				.where(eq(notice.id, m.id))
				.run();
		}
	}
	return sent;
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
