import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/** @type {import('@sveltejs/kit').Config} */
export default {
	preprocess: vitePreprocess(),
	kit: {
		// PW_BUILD_DIR: `npm run bench` builds its own server (with the bench's floor) beside build/
		// rather than over it; see scripts/app.ts.
		adapter: adapter({ out: process.env.PW_BUILD_DIR || 'build' }),
		// Test fixtures (example specs, synthetic photos, the makerjs model the DXF is checked
		// against) live outside src, so no production import can reach them.
		alias: { $support: 'tests/support' },
		// The pages' Content-Security-Policy. `auto`: SvelteKit puts a fresh nonce on the inline
		// script it writes into each rendered page (hashes if a page were prerendered), so scripts
		// need no 'unsafe-inline'. Styles keep it: the markup carries style attributes (the theme
		// comes from a server-side attribute, not a script). Answers that are not pages get a stricter
		// policy in src/lib/server/security-headers.ts.
		csp: {
			mode: 'auto',
			directives: {
				'default-src': ['self'],
				'script-src': ['self'],
				'style-src': ['self', 'unsafe-inline'],
				'img-src': ['self'],
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
