// A mail server that is down loses nothing: the outbox keeps the message, retries with growing
// pauses and delivers once the server is back. Real SMTP on loopback (the local catcher).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, describe, expect, it } from 'vitest';
import { SMTPServer } from 'smtp-server';
import { eq } from 'drizzle-orm';
import { caughtMail, freePort } from '../support/server';

const dir = mkdtempSync(join(tmpdir(), 'wakeline-outbox-'));
process.env.DATABASE_PATH = join(dir, 'outbox.db');

const { migrateDb, openDb } = await import('../../src/lib/server/db/client');
const { notice } = await import('../../src/lib/server/db/schema');
const outbox = await import('../../src/lib/server/mail/outbox');
const { startCatcher } = await import('../../src/lib/server/mail/catcher');

const db = openDb(process.env.DATABASE_PATH);
migrateDb(db);

afterAll(() => {
	outbox.useTransport(null);
	db.$client.close();
	rmSync(dir, { recursive: true, force: true });
});

describe('mail outbox', () => {
	it('keeps a message while the server is down and delivers it when it is back', async () => {
		const port = await freePort(); // nothing listens here yet
		outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
		const id = outbox.enqueue(db, {
			to: 'someone@example.org',
			subject: 'Schedule changed',
			text: 'Sailing moved by a day.',
			kind: 'schedule'
		});

		const t0 = new Date();
		expect(await outbox.sweep(db, t0)).toBe(0);
		let row = db
			.select()
			.from(notice)
			.all()
			.find((n) => n.id === id)!;
		expect(row.status).toBe('queued');
		expect(row.attempts).toBe(1);
		expect(row.lastError).toMatch(/ECONNREFUSED/);
		expect(row.nextAttemptAt.getTime()).toBeGreaterThan(t0.getTime() + 25_000);

		// Not due yet: a sweep now sends nothing and does not count an attempt.
		expect(await outbox.sweep(db, new Date())).toBe(0);
		expect(
			db
				.select()
				.from(notice)
				.all()
				.find((n) => n.id === id)!.attempts
		).toBe(1);

		const mailDir = join(dir, 'mail');
		const { server } = await startCatcher({ port, dir: mailDir });
		try {
			outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
			expect(await outbox.sweep(db, new Date(Date.now() + 60_000))).toBe(1);
			row = db
				.select()
				.from(notice)
				.all()
				.find((n) => n.id === id)!;
			expect(row.status).toBe('sent');
			expect(row.attempts).toBe(2);
			const caught = await caughtMail(mailDir);
			expect(caught).toHaveLength(1);
			expect(caught[0].subject).toBe('Schedule changed');
			expect(caught[0].to).toContain('someone@example.org');
		} finally {
			await new Promise<void>((r) => server.close(() => r()));
		}
	});

	it('gives up after the last attempt and marks the message failed', async () => {
		const port = await freePort();
		outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
		const id = outbox.enqueue(db, { to: 'x@example.org', subject: 's', text: 't', kind: 'test' });
		let when = Date.now();
		for (let i = 0; i < outbox.MAX_ATTEMPTS; i++) {
			await outbox.sweep(db, new Date(when));
			when += 2 * 3_600_000;
		}
		const row = db
			.select()
			.from(notice)
			.all()
			.find((n) => n.id === id)!;
		expect(row.attempts).toBe(outbox.MAX_ATTEMPTS);
		expect(row.status).toBe('failed');
	});

	it('a message given up while the server was down goes out by itself once the server answers', async () => {
		const port = await freePort();
		outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
		const id = outbox.enqueue(db, {
			to: 'late@example.org',
			subject: 'Late',
			text: 't',
			kind: 'test'
		})!;
		let when = Date.now();
		for (let i = 0; i < outbox.MAX_ATTEMPTS; i++) {
			await outbox.sweep(db, new Date(when));
			when += 2 * 3_600_000;
		}
		const status = () => db.select().from(notice).where(eq(notice.id, id)).get()!.status;
		expect(status()).toBe('failed');

		const mailDir = join(dir, 'mail-back');
		const { server } = await startCatcher({ port, dir: mailDir });
		try {
			outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
			// Any delivery shows the server is back; the failed message is queued again ...
			outbox.enqueue(db, { to: 'now@example.org', subject: 'Now', text: 't', kind: 'test' });
			expect(await outbox.sweep(db, new Date(Date.now() + 60_000))).toBeGreaterThan(0);
			expect(status()).toBe('queued');
			// ... and delivered at the next sweep.
			await outbox.sweep(db, new Date(Date.now() + 60_000));
			expect(status()).toBe('sent');
			const subjects = (await caughtMail(mailDir)).map((m) => m.subject);
			expect(subjects).toContain('Late');
		} finally {
			await new Promise<void>((r) => server.close(() => r()));
		}
	});

	it('a permanent refusal (5yz) is failed at once and not retried by itself; "retry now" queues it again', async () => {
		const port = await freePort();
		const server = new SMTPServer({
			authOptional: true,
			disabledCommands: ['STARTTLS'],
			onRcptTo(address, _session, cb) {
				if (address.address.startsWith('nobody@')) {
					const err = new Error('5.1.1 mailbox unavailable') as Error & { responseCode: number };
					err.responseCode = 550;
					return cb(err);
				}
				cb();
			},
			onData(stream, _session, cb) {
				stream.resume();
				stream.on('end', () => cb());
			}
		});
		await new Promise<void>((r) => server.listen(port, '127.0.0.1', () => r()));
		try {
			outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
			const bad = outbox.enqueue(db, {
				to: 'nobody@example.org',
				subject: 'x',
				text: 't',
				kind: 'test'
			})!;
			outbox.enqueue(db, { to: 'fine@example.org', subject: 'y', text: 't', kind: 'test' });
			await outbox.sweep(db, new Date(Date.now() + 60_000));
			const row = () => db.select().from(notice).where(eq(notice.id, bad)).get()!;
			expect(row().status).toBe('failed');
			expect(row().attempts).toBe(1);
			expect(row().lastError).toMatch(/^\[permanent\] .*550/);
			// The good delivery does not bring the permanent refusal back.
			await outbox.sweep(db, new Date(Date.now() + 120_000));
			expect(row().status).toBe('failed');
			expect(outbox.retryNow([bad], db)).toBe(1);
			expect(row().status).toBe('queued');
			expect(row().attempts).toBe(0);
		} finally {
			await new Promise<void>((r) => server.close(() => r()));
		}
	});

	it('a reset link that expired while its message waited is not sent; the message says so', async () => {
		const port = await freePort();
		const mailDir = join(dir, 'mail-expired');
		const { server } = await startCatcher({ port, dir: mailDir });
		try {
			outbox.useTransport(nodemailer.createTransport(`smtp://127.0.0.1:${port}`));
			const id = outbox.enqueue(db, {
				to: 'forgot@example.org',
				subject: 'Reset your Wakeline password',
				text: 'Choose a new password here: http://localhost/reset/SECRET-TOKEN',
				kind: 'password_reset'
			})!;
			// Queued two hours ago (the link works for an hour).
			db.update(notice)
				.set({ createdAt: new Date(Date.now() - 2 * 3_600_000) })
				.where(eq(notice.id, id))
				.run();
			await outbox.sweep(db, new Date());
			const mail = (await caughtMail(mailDir)).find((m) => m.to.includes('forgot@example.org'))!;
			expect(mail.subject).toMatch(/link expired/);
			expect(mail.text).not.toContain('SECRET-TOKEN');
			expect(mail.text).toMatch(/Ask for a new one at .*\/reset/);
		} finally {
			await new Promise<void>((r) => server.close(() => r()));
		}
	});

	it('backs off exponentially up to an hour', () => {
		expect(outbox.backoffMs(1)).toBe(30_000);
		expect(outbox.backoffMs(2)).toBe(60_000);
		expect(outbox.backoffMs(3)).toBe(120_000);
		expect(outbox.backoffMs(20)).toBe(3_600_000);
	});
});
