/**
 * Chart benchmark: `npm run bench:chart` (after `npx vite build`). Starts the built app on a
 * throwaway database (the demo seeded), opens the demo cruise's chart in Debian's headless Chromium
 * (playwright-core, SwiftShader WebGL) and prints, per run and as a median, the time from opening
 * the chart page to:
 *   - plan drawn: the map's `data-plan-drawn` signal (the plan source loaded and rendered);
 *   - ready: drawing tools live (`data-ready`);
 *   - figures: predicted isobaths computed and shown (`data-depth-drawn`).
 * The target for "plan drawn" is under 1.5 s on this machine.
 */
import { chromium } from 'playwright-core';
import { cpus, loadavg } from 'node:os';
import { DEMO, startServer } from '../tests/support/server';

const RUNS = Number(process.env.RUNS || 5);

function median(xs: number[]): number {
	const s = xs.slice().sort((a, b) => a - b);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : 0.5 * (s[m - 1] + s[m]);
}

// Served as `npm start` serves it: the client address from the socket, not a proxy header.
const server = await startServer({ ADDRESS_HEADER: '', XFF_DEPTH: '' });
const browser = await chromium.launch({
	executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
	headless: true,
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
});
const rows: { drawn: number; ready: number; depth: number }[] = [];
try {
	const context = await browser.newContext({ viewport: { width: 1400, height: 900 } });
	const page = await context.newPage();
	await page.goto(`${server.url}/signin`);
	await page.getByLabel('E-mail').fill(DEMO.chief);
	await page.getByLabel('Password').fill(DEMO.password);
	await page.getByRole('button', { name: 'Sign in' }).click();
	await page.waitForURL(/\/cruises$/);
	const href = await page
		.getByRole('list', { name: 'Cruises' })
		.getByRole('link')
		.first()
		.getAttribute('href');
	const chartUrl = `${server.url}${href}/chart`;
	// One warm-up run so the browser's cache holds the scripts, as for a returning user.
	for (let i = -1; i < RUNS; i++) {
		await page.goto('about:blank');
		const t0 = Date.now();
		await page.goto(chartUrl);
		const map = page.getByRole('application', { name: 'Cruise chart' });
		const at = async (attr: string) => {
			await map.and(page.locator(`[${attr}="true"]`)).waitFor({ timeout: 60_000 });
			return Date.now() - t0;
		};
		const drawn = await at('data-plan-drawn');
		const ready = await at('data-ready');
		const depth = await at('data-depth-drawn');
		if (i >= 0) {
			rows.push({ drawn, ready, depth });
			console.log(
				`run ${i + 1}: plan drawn ${drawn} ms · tools ready ${ready} ms · isobaths ${depth} ms`
			);
		}
	}
} finally {
	await browser.close();
	await server.stop();
}

const [c, load] = [cpus().length, loadavg()[0].toFixed(2)];
console.log(
	`\nChart (demo cruise, 1400×900, headless Chromium, ${c} cores, load ${load}), median of ${RUNS}:`
);
console.log(`  plan drawn    ${median(rows.map((r) => r.drawn))} ms   (target < 1500 ms)`);
console.log(`  tools ready   ${median(rows.map((r) => r.ready))} ms`);
console.log(`  isobaths      ${median(rows.map((r) => r.depth))} ms`);
