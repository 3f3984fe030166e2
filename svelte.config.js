import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// BUILD_DIR lets parallel builds (e.g. several test runs) keep apart.
		adapter: adapter({ out: process.env.BUILD_DIR || 'build' }),
		csrf: { trustedOrigins: [] },
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
