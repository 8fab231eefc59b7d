import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: [vitePreprocess()],
	vitePlugin: {
		// runes everywhere in our code; packages keep their own mode
		dynamicCompileOptions: ({ filename }) => (filename.includes('node_modules') ? undefined : { runes: true })
	},
	kit: {
		adapter: adapter(),
		// Content-Security-Policy on every page Kit renders; 'hash' lists the sha256 of the inline start-up script, so
		// only our own scripts run and the same page is the same bytes each time (the visitor page cache keeps them whole)
		csp: {
			mode: 'hash',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				// Svelte writes inline style attributes (widgets, charts, progress bars); with 'unsafe-inline' here Kit adds no style nonce
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				// Vite inlines small font files as data: URLs
				'font-src': ['self', 'data:'],
				'connect-src': ['self'],
				'media-src': ['self', 'blob:'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'frame-ancestors': ['none']
			}
		},
		version: { name: process.env.npm_package_version ?? '0.1.0' }
	}
};

export default config;
