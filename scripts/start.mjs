#!/usr/bin/env node
// `npm start`: install if needed, build, then serve with migrations, demo seed and local fakes.
// Plain JavaScript so it runs before any dependency is installed.
import { execSync } from 'node:child_process';
import { existsSync } from 'node:fs';

const run = (cmd) => execSync(cmd, { stdio: 'inherit' });

if (
	!existsSync('node_modules/.package-lock.json') ||
	!existsSync('node_modules/better-sqlite3/build')
) {
	console.log('Installing dependencies (npm ci)…');
	run('npm ci --no-audit --no-fund');
}
if (process.env.SKIP_BUILD !== '1' || !existsSync('build/index.js')) {
	console.log('Building…');
	run('npx vite build --logLevel warn');
}
run('npx tsx scripts/serve.ts');
