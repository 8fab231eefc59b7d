import { sveltekit } from '@sveltejs/kit/vite';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [tailwindcss(), sveltekit()],
	// the timing report says only that Svelte compiling is most of the build, which it is meant to be
	build: { rolldownOptions: { checks: { bundlerTimings: false } } },
	test: {
		expect: { requireAssertions: true },
		include: ['src/**/*.spec.ts', 'tests/integration/**/*.spec.ts'],
		// integration tests share one PostgreSQL database: run files one after another
		fileParallelism: false,
		testTimeout: 30_000,
		hookTimeout: 60_000
	}
});
