import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';

/**
 * The Content-Security-Policy of every page SvelteKit renders. Scripts come
 * from the app's own origin only, plus SvelteKit's own inline start-up script,
 * which it marks with a per-response nonce ('auto': a hash instead on any
 * prerendered page); no 'unsafe-inline' and no 'unsafe-eval' for scripts.
 * A nonce rather than 'hash' on rendered pages because that start-up script
 * carries the page's data (130 KB on the scenario editor), and SvelteKit
 * would hash it in JavaScript on every request.
 *
 * Styles allow 'unsafe-inline' on purpose: pages carry style attributes that
 * SvelteKit cannot hash (app.html's `display: contents` wrapper, a chart's
 * height, a power-matrix cell's shade set from data), and CSP ignores
 * 'unsafe-inline' as soon as a hash or nonce sits beside it, so SvelteKit adds
 * none to style-src while it is there. An inline style cannot run script;
 * Chart.js sizes its canvas through the CSSOM, which CSP does not govern.
 *
 * @type {import('@sveltejs/kit').KitConfig['csp']}
 */
const contentSecurityPolicy = {
	mode: 'auto',
	directives: {
		'default-src': ['self'],
		'script-src': ['self'],
		'style-src': ['self', 'unsafe-inline'],
		'img-src': ['self', 'data:'],
		'font-src': ['self'],
		'connect-src': ['self'],
		'frame-ancestors': ['none'],
		'base-uri': ['self'],
		'form-action': ['self'],
		'object-src': ['none']
	}
};

/** @type {import('@sveltejs/kit').Config} */
const config = {
	preprocess: vitePreprocess(),
	kit: {
		adapter: adapter(),
		csrf: { trustedOrigins: [] },
		csp: contentSecurityPolicy
	}
};

export default config;
