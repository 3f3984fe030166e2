import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// BUILD_DIR lets parallel builds (e.g. several test runs) keep apart.
		adapter: adapter({ out: process.env.BUILD_DIR || 'build' }),
		// Origin checks on form posts are done in hooks.server.ts (src/lib/server/csrf.ts), which
		// lets RFC 8058 one-click unsubscribe through; SvelteKit's own check cannot make exceptions.
		csrf: { trustedOrigins: ['*'] },
		typescript: {
			// Type-check the scripts and root config files too, not only src/ and tests/.
			config: (cfg) => {
				cfg.include.push(
					'../scripts/**/*.ts',
					'../drizzle.config.ts',
					'../tailwind.config.ts',
					'../playwright.config.ts'
				);
			}
		}
	}
};

export default config;
