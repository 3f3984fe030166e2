#!/usr/bin/env node
// `npm test`: everything — types, lint, unit, build, integration, browser end-to-end.
// On a fresh machine it installs what it lacks (npm packages; Debian's Chromium when run as root)
// or stops with the one command that does. Plain JavaScript so it runs before npm ci.
import { execSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const run = (title, cmd) => {
	console.log(`\n▶ ${title}\n  $ ${cmd}`);
	const t0 = Date.now();
	execSync(cmd, { stdio: 'inherit' });
	console.log(`  ✔ ${title} (${((Date.now() - t0) / 1000).toFixed(1)} s)`);
};

if (
	!existsSync('node_modules/.package-lock.json') ||
	!existsSync('node_modules/better-sqlite3/build')
) {
	run('install npm packages', 'npm ci --no-audit --no-fund');
}

const chromium = process.env.CHROMIUM_PATH || '/usr/bin/chromium';
if (!existsSync(chromium)) {
	const cmd = 'apt-get update && apt-get install -y --no-install-recommends chromium';
	if (process.getuid?.() === 0) {
		run("install Debian's Chromium for the browser tests", cmd);
	} else {
		console.error(
			`\nThe browser tests need Debian's Chromium. Install it with:\n\n  sudo sh -c '${cmd}'\n`
		);
		process.exit(1);
	}
}

// The export tests read every file back with GDAL (ogrinfo) and gpsbabel; say which is missing.
const onPath = (bin) =>
	(process.env.PATH || '').split(':').some((dir) => dir && existsSync(`${dir}/${bin}`));
const readers = [
	['ogrinfo', 'gdal-bin'],
	['gpsbabel', 'gpsbabel']
].filter(([bin]) => !onPath(bin));
if (readers.length) {
	const names = readers.map(([bin, pkg]) => `${bin} (Debian ${pkg})`).join(' and ');
	const cmd = `apt-get update && apt-get install -y --no-install-recommends ${readers.map(([, pkg]) => pkg).join(' ')}`;
	if (process.getuid?.() === 0) {
		run(`install the export readers: ${names}`, cmd);
	} else {
		console.error(
			`\nThe export tests read files back with ${names}. Install with:\n\n  sudo sh -c '${cmd}'\n`
		);
		process.exit(1);
	}
}

const only = process.argv[2];
const steps = [
	['types (svelte-check)', 'npm run -s check'],
	['lint (prettier + eslint)', 'npm run -s lint'],
	['unit tests', 'npx vitest run --project unit'],
	['build', 'npx vite build --logLevel warn'],
	['integration tests', 'npx vitest run --project integration'],
	['browser end-to-end tests', 'npx playwright test']
];
for (const [title, cmd] of steps) if (!only || title.startsWith(only)) run(title, cmd);
console.log('\nAll green.');
