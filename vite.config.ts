import { sveltekit } from '@sveltejs/kit/vite';
import { defineConfig } from 'vitest/config';

export default defineConfig({
	plugins: [sveltekit()],
	// Tailwind 4 is loaded by the server build too; bundling it avoids ENOENT at build time.
	ssr: { noExternal: ['tailwindcss'] },
	// The bundler's plugin-timing notes are informational and drown the test output.
	build: { rolldownOptions: { checks: { bundlerTimings: false } } },
	test: {
		include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts'],
		environment: 'node',
		testTimeout: 30000,
		hookTimeout: 60000,
		fileParallelism: false
	}
});
