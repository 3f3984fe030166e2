import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// BUILD_DIR lets parallel builds (e.g. several test runs) keep apart.
		adapter: adapter({ out: process.env.BUILD_DIR || 'build' }),
		// The cross-site form check is done in hooks.server.ts (src/lib/server/csrf.ts), so that
		// API paths refuse in the JSON error shape and RFC 8058 one-click unsubscribe gets through.
		csrf: { trustedOrigins: ['*'] },
		// Content-Security-Policy on every page and error page; SvelteKit adds nonces (hashes for
		// prerendered pages) for its own inline scripts. MapLibre runs its worker from our own
		// bundle and makes blob: URLs for images and workers; styles stay inline-able because
		// Svelte and MapLibre set style attributes.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self', 'data:'],
				'connect-src': ['self', 'blob:', 'data:'],
				'worker-src': ['self', 'blob:'],
				'child-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				// the payment step hands over to the payment service's hosted page (the local one on loopback)
				'form-action': [
					'self',
					'https://checkout.stripe.com',
					'http://127.0.0.1:*',
					'http://localhost:*'
				],
				'frame-ancestors': ['none']
			}
		},
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
