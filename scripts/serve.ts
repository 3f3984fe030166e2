// Runs the built app: migrate, seed the demo once, start the local fakes unless real services are
// configured, then the adapter-node server. `npm start` calls this after installing and building.
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync } from 'node:fs';
import { createInterface } from 'node:readline';
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { config } from '../src/lib/server/config';
import { migrateDb, openDb } from '../src/lib/server/db/client';
import { startCatcher } from '../src/lib/server/mail/catcher';
import { DEMO_PASSWORD, DEMO_USERS, seedDemo } from './demo';

const port = Number(process.env.PORT || 3000);
const host = process.env.HOST || '0.0.0.0';
process.env.PORT = String(port);
process.env.HOST = host;
process.env.ORIGIN ||= `http://localhost:${port}`;
// Uploads and forms: adapter-node's default body limit is 512 KiB; plan imports need more.
process.env.BODY_SIZE_LIMIT ||= String(60 * 1024 * 1024);

const db = openDb(config.databasePath);
migrateDb(db);
const seeded = process.env.SEED_DEMO === '0' ? false : await seedDemo(db);
db.$client.close();

const fakes: string[] = [];
const closers: (() => void)[] = [];
// adapter-node closes its HTTP server on SIGTERM/SIGINT; the fakes must close too or the process lingers.
for (const signal of ['SIGTERM', 'SIGINT'] as const)
	process.once(signal, () => {
		for (const close of closers) close();
		setTimeout(() => process.exit(0), 2000).unref();
	});
if (!config.smtpUrl) {
	const { server: catcher, port: smtpPort } = await startCatcher({
		port: Number(process.env.MAIL_CATCHER_PORT || 2525),
		dir: config.mailCatcherDir
	});
	closers.push(() => catcher.close());
	process.env.SMTP_URL = `smtp://127.0.0.1:${smtpPort}`;
	process.env.MAIL_CATCHER = '1';
	fakes.push(`mail catcher on 127.0.0.1:${smtpPort} (read it at /admin/mail)`);
}

// Payments: without a real key, the local payment service runs as its own process on loopback and
// the SDK is pointed at it; the webhook secret is shared (or generated) so its events verify.
if (!process.env.STRIPE_SECRET_KEY) {
	process.env.STRIPE_SECRET_KEY = `sk_test_local_${randomBytes(12).toString('hex')}`;
	process.env.STRIPE_WEBHOOK_SECRET ||= `whsec_${randomBytes(24).toString('base64url')}`;
	const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/fake-payments.ts'], {
		env: {
			...process.env,
			FAKE_PAYMENTS_PORT: process.env.FAKE_PAYMENTS_PORT || '0',
			FAKE_PAYMENTS_WEBHOOK_URL: `http://127.0.0.1:${port}/api/v1/payments/webhook`
		},
		stdio: ['pipe', 'pipe', 'inherit']
	});
	const line = await new Promise<string>((ok, fail) => {
		const rl = createInterface({ input: child.stdout! });
		rl.once('line', ok);
		child.once('exit', (code) => fail(new Error(`the payment service exited (${code})`)));
	});
	const payPort = (JSON.parse(line) as { port: number }).port;
	closers.push(() => child.kill('SIGTERM'));
	process.env.STRIPE_API_HOST = '127.0.0.1';
	process.env.STRIPE_API_PORT = String(payPort);
	process.env.STRIPE_API_PROTOCOL = 'http';
	fakes.push(`payment service on 127.0.0.1:${payPort} (test card 4242 4242 4242 4242)`);
}

const entry = resolve(process.env.BUILD_DIR || 'build', 'index.js');
if (!existsSync(entry)) {
	console.error('No build found. Run `npm run build` first (npm start does it for you).');
	process.exit(1);
}
await import(pathToFileURL(entry).href);

const shown = process.env.ORIGIN;
console.log(`
  Wakeline is running at ${shown}
  Database: ${resolve(config.databasePath)}${seeded ? ' (demo seeded now)' : ''}
  ${fakes.length ? 'Local fakes: ' + fakes.join('; ') : 'Using the configured SMTP server'}

  Demo sign-ins (password for all: ${DEMO_PASSWORD})
${DEMO_USERS.map((u) => `    ${u.email.padEnd(26)} ${u.what}`).join('\n')}
`);
