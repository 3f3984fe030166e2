// A mail server that is down loses nothing: the outbox keeps the message, retries with growing
// pauses and delivers once the server is back. Real SMTP on loopback (the local catcher).
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import nodemailer from 'nodemailer';
import { afterAll, describe, expect, it } from 'vitest';
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

	it('backs off exponentially up to an hour', () => {
		expect(outbox.backoffMs(1)).toBe(30_000);
		expect(outbox.backoffMs(2)).toBe(60_000);
		expect(outbox.backoffMs(3)).toBe(120_000);
		expect(outbox.backoffMs(20)).toBe(3_600_000);
	});
});
