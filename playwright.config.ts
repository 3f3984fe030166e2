import { defineConfig } from '@playwright/test';
import { E2E_DIR, E2E_PORT, e2eEnv } from './tests/e2e/env';

// Browser tests run in Debian's Chromium (apt-get install chromium), never a downloaded browser.
export default defineConfig({
	testDir: 'tests/e2e',
	outputDir: 'test-results/e2e',
	fullyParallel: false,
	workers: 1,
	retries: 0,
	timeout: 60_000,
	expect: { timeout: 10_000 },
	reporter: [['list']],
	use: {
		baseURL: `http://127.0.0.1:${E2E_PORT}`,
		browserName: 'chromium',
		headless: true,
		viewport: { width: 1400, height: 900 },
		screenshot: 'only-on-failure',
		trace: 'retain-on-failure',
		launchOptions: {
			executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
			args: [
				'--no-sandbox',
				'--disable-gpu',
				'--disable-quic',
				'--no-first-run',
				'--disable-background-networking',
				'--disable-component-update',
				'--disable-sync',
				'--use-angle=swiftshader',
				'--enable-unsafe-swiftshader'
			]
		}
	},
	webServer: {
		// A throwaway database and mail folder, wiped at each run, served like `npm start` serves.
		command: `rm -rf ${E2E_DIR} && node --import tsx scripts/serve.ts`,
		url: `http://127.0.0.1:${E2E_PORT}/signin`,
		env: e2eEnv(),
		reuseExistingServer: false,
		timeout: 90_000,
		stdout: 'ignore',
		stderr: 'pipe'
	}
});
