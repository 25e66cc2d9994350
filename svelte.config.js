import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		// The test command builds into its own folders so that it can run beside `npm start`.
		adapter: adapter({ out: process.env.BUILD_DIR ?? 'build' }),
		outDir: process.env.SVELTEKIT_OUT_DIR ?? '.svelte-kit',
		csrf: { trustedOrigins: [] },
		// Only our own origin may serve scripts, styles, fonts and frames; nobody may frame us.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self', 'data:', 'blob:'],
				'font-src': ['self'],
				'connect-src': ['self'],
				'object-src': ['none'],
				'base-uri': ['self'],
				'form-action': ['self'],
				'frame-ancestors': ['none']
			}
		}
	}
};

export default config;
