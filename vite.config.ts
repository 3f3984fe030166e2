import tailwindcss from '@tailwindcss/vite';
import { sveltekit } from '@sveltejs/kit/vite';
import { build as esbuild } from 'esbuild';
import { resolve } from 'node:path';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';

/**
 * `virtual:engine-worker`: the engine worker (src/lib/server/engine-worker.ts) bundled into one
 * self-contained ESM file, as a string the engine pool writes out and starts. Built this way so the
 * worker needs no path into the server build, which adapter-node rebundles.
 */
function engineWorker(): Plugin {
	const id = 'virtual:engine-worker';
	const entry = resolve('src/lib/server/engine-worker.ts');
	return {
		name: 'wakeline-engine-worker',
		resolveId: (source) => (source === id ? '\0' + id : undefined),
		async load(source) {
			if (source !== '\0' + id) return;
			const out = await esbuild({
				entryPoints: [entry],
				bundle: true,
				write: false,
				format: 'esm',
				platform: 'node',
				target: 'node20',
				alias: { $lib: resolve('src/lib') },
				logLevel: 'warning',
				metafile: true
			});
			for (const f of out.metafile ? Object.keys(out.metafile.inputs) : []) this.addWatchFile(f);
			return `export default ${JSON.stringify(out.outputFiles[0].text)};`;
		}
	};
}

export default defineConfig({
	plugins: [tailwindcss(), sveltekit(), engineWorker()],
	server: { fs: { allow: ['static'] } },
	test: {
		projects: [
			{
				extends: './vite.config.ts',
				test: {
					name: 'unit',
					environment: 'node',
					include: ['src/**/*.spec.ts']
				}
			},
			{
				extends: './vite.config.ts',
				test: {
					name: 'integration',
					environment: 'node',
					include: ['tests/integration/**/*.test.ts'],
					fileParallelism: false,
					testTimeout: 30_000,
					hookTimeout: 60_000
				}
			}
		]
	}
});
