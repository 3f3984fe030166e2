// Theme tokens for Wakeline, loaded from src/app.css with `@config` (Tailwind 4 reads it there).
import type { Config } from 'tailwindcss';

export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: {
				sans: ['"Inter Variable"', 'ui-sans-serif', 'system-ui', 'sans-serif']
			},
			colors: {
				// Deep-water blues for the chrome, a basalt grey for text, a kelp green for "ok",
				// amber for cautions. Our own palette.
				abyss: {
					50: '#eef6fb',
					100: '#d5e9f5',
					200: '#aed3ea',
					300: '#7db6da',
					400: '#4b93c4',
					500: '#2c76ab',
					600: '#1f5d8c',
					700: '#1b4b71',
					800: '#183d5c',
					900: '#12293f',
					950: '#0b1a29'
				},
				basalt: {
					50: '#f6f7f8',
					100: '#eceef1',
					200: '#d5d9df',
					300: '#b0b8c2',
					400: '#8590a0',
					500: '#667285',
					600: '#515b6c',
					700: '#434a58',
					800: '#3a404b',
					900: '#33373f',
					950: '#212429'
				},
				kelp: { 500: '#2f8f5b', 600: '#23744a', 100: '#dcf2e5' },
				caution: { 100: '#fdf0d2', 500: '#d99a12', 700: '#8a5d06' }
			}
		}
	}
} satisfies Config;
