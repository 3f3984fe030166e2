import { join, resolve } from 'node:path';

export const E2E_PORT = Number(process.env.E2E_PORT || 4319);
// One folder per port, so parallel runs (other checkouts, other ports) never share a database.
export const E2E_DIR = resolve('.e2e-data', String(E2E_PORT));
export const E2E_MAIL_DIR = join(E2E_DIR, 'mail');
export const E2E_DB = join(E2E_DIR, 'test.db');
export const SCREENSHOTS = resolve('test-results/screens');

export function e2eEnv(): Record<string, string> {
	return {
		DATABASE_PATH: E2E_DB,
		UPLOAD_DIR: join(E2E_DIR, 'uploads'),
		MAIL_CATCHER_DIR: E2E_MAIL_DIR,
		MAIL_CATCHER_PORT: '0',
		PORT: String(E2E_PORT),
		HOST: '127.0.0.1',
		ORIGIN: `http://127.0.0.1:${E2E_PORT}`,
		OUTBOX_INTERVAL_MS: '200',
		SMTP_URL: '',
		STRIPE_SECRET_KEY: '',
		FAKE_PAYMENTS_RETRY_MS: '300'
	};
}
