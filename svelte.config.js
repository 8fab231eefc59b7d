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
		version: { name: process.env.npm_package_version ?? '0.1.0' }
	}
};

export default config;
