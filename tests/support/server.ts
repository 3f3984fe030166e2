// Starts the built app the way `npm start` serves it, on a throwaway SQLite file and mail folder,
// for integration and browser tests. Real HTTP, real SMTP (the local catcher), real database.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { DEMO_PASSWORD } from '../../scripts/demo';

export interface TestServer {
	url: string;
	dir: string;
	dbPath: string;
	mailDir: string;
	/** Stops the server; `keep` leaves its database and mail folder for a restart. */
	stop(opts?: { keep?: boolean }): Promise<void>;
}

export function freePort(): Promise<number> {
	return new Promise((resolve, reject) => {
		const s = createServer();
		s.once('error', reject);
		s.listen(0, '127.0.0.1', () => {
			const addr = s.address();
			const port = typeof addr === 'object' && addr ? addr.port : 0;
			s.close(() => resolve(port));
		});
	});
}

export function testEnv(dir: string, port: number): Record<string, string> {
	return {
		DATABASE_PATH: join(dir, 'test.db'),
		UPLOAD_DIR: join(dir, 'uploads'),
		MAIL_CATCHER_DIR: join(dir, 'mail'),
		MAIL_CATCHER_PORT: '0',
		PORT: String(port),
		HOST: '127.0.0.1',
		ORIGIN: `http://127.0.0.1:${port}`,
		OUTBOX_INTERVAL_MS: '200',
		// The local payment service, unless a test names another one.
		STRIPE_SECRET_KEY: '',
		FAKE_PAYMENTS_RETRY_MS: '200',
		// Each test may pose as its own client address, so address throttling is testable.
		ADDRESS_HEADER: 'x-forwarded-for',
		XFF_DEPTH: '1'
	};
}

export async function startServer(
	extraEnv: Record<string, string> = {},
	/** Restart on the folder (database, mail) of a server stopped with `keep`. */
	reuseDir?: string
): Promise<TestServer> {
	const dir = reuseDir ?? mkdtempSync(join(tmpdir(), 'wakeline-test-'));
	const port = extraEnv.PORT ? Number(extraEnv.PORT) : await freePort();
	const env = { ...process.env, ...testEnv(dir, port), ...extraEnv };
	const child: ChildProcess = spawn(process.execPath, ['--import', 'tsx', 'scripts/serve.ts'], {
		env,
		stdio: ['ignore', 'pipe', 'pipe']
	});
	let log = '';
	child.stdout?.on('data', (d) => (log += d));
	child.stderr?.on('data', (d) => (log += d));
	const url = `http://127.0.0.1:${port}`;
	const deadline = Date.now() + 60_000;
	for (;;) {
		if (child.exitCode !== null) throw new Error(`The server exited early:\n${log}`);
		try {
			const res = await fetch(`${url}/signin`);
			if (res.ok) break;
		} catch {
			/* not up yet */
		}
		if (Date.now() > deadline) throw new Error(`The server did not start in 60 s:\n${log}`);
		await new Promise((r) => setTimeout(r, 200));
	}
	return {
		url,
		dir,
		dbPath: env.DATABASE_PATH!,
		mailDir: env.MAIL_CATCHER_DIR!,
		async stop(opts?: { keep?: boolean }) {
			if (child.exitCode === null) {
				const exited = new Promise((r) => child.once('exit', r));
				child.kill('SIGTERM');
				const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
				await exited;
				clearTimeout(timer);
			}
			if (!opts?.keep) rmSync(dir, { recursive: true, force: true });
		}
	};
}

export interface Caught {
	to: string;
	subject: string;
	text: string;
	attachments: string[];
}

export async function caughtMail(mailDir: string): Promise<Caught[]> {
	let files: string[];
	try {
		files = readdirSync(mailDir)
			.filter((f) => f.endsWith('.eml'))
			.sort();
	} catch {
		return [];
	}
	const out: Caught[] = [];
	for (const f of files) {
		const m = await simpleParser(readFileSync(join(mailDir, f)));
		const to = Array.isArray(m.to) ? m.to.map((a) => a.text).join(', ') : (m.to?.text ?? '');
		out.push({
			to,
			subject: m.subject ?? '',
			text: m.text ?? '',
			attachments: m.attachments.map((a) => a.filename ?? '')
		});
	}
	return out;
}

/** Waits until a caught mail matches, e.g. the reset link sent to an address. */
export async function waitForMail(
	mailDir: string,
	match: (m: Caught) => boolean,
	timeoutMs = 15_000
): Promise<Caught> {
	const deadline = Date.now() + timeoutMs;
	for (;;) {
		const found = (await caughtMail(mailDir)).find(match);
		if (found) return found;
		if (Date.now() > deadline) throw new Error('No matching mail arrived in time.');
		await new Promise((r) => setTimeout(r, 150));
	}
}

export const DEMO = {
	password: DEMO_PASSWORD,
	admin: 'admin@example.org',
	chief: 'chief@example.org',
	participant: 'participant@example.org',
	agent: 'agent@example.org',
	master: 'master@example.org'
};

/** A browser-style (non-JavaScript) form post: answers are HTML pages or 303 redirects. */
export function formPost(
	url: string,
	path: string,
	fields: Record<string, string>,
	opts: { cookie?: string; address?: string } = {}
): Promise<Response> {
	return fetch(url + path, {
		method: 'POST',
		body: new URLSearchParams(fields),
		redirect: 'manual',
		headers: {
			origin: url,
			accept: 'text/html',
			...(opts.cookie ? { cookie: opts.cookie } : {}),
			...(opts.address ? { 'x-forwarded-for': opts.address } : {})
		}
	});
}

/** Signs in through the real form and returns the session cookie. */
export async function signIn(
	url: string,
	email: string,
	password = DEMO.password,
	address = '10.0.0.1'
): Promise<{ status: number; cookie: string | null; location: string | null; body: string }> {
	const res = await formPost(url, '/signin', { email, password }, { address });
	const set = res.headers.getSetCookie().find((c) => c.startsWith('wl_session='));
	return {
		status: res.status,
		cookie: set ? set.split(';')[0] : null,
		location: res.headers.get('location'),
		body: await res.text()
	};
}
