import adapter from '@sveltejs/adapter-node';
import { vitePreprocess } from '@sveltejs/vite-plugin-svelte';
import { mdsvex } from 'mdsvex';

/** @type {import('@sveltejs/kit').Config} */
const config = {
	extensions: ['.svelte', '.md'],
	preprocess: [vitePreprocess(), mdsvex({ extensions: ['.md'] })],
	compilerOptions: {
		// mdsvex emits legacy `$$props`; everything else runs in runes mode.
		runes: ({ filename }) =>
			filename.endsWith('.md') || filename.split(/[/\\]/).includes('node_modules')
				? undefined
				: true
	},
	kit: {
		// BUILD_DIR / KIT_OUT_DIR let parallel work build side by side; defaults are SvelteKit's own.
		adapter: adapter({ out: process.env.BUILD_DIR || 'build' }),
		outDir: process.env.KIT_OUT_DIR || '.svelte-kit',
		alias: { $content: 'content' },
		// Nonces for dynamic pages; src/lib/server/http/page-cache.ts gives each copy of a kept page a fresh one.
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
				'base-uri': ['none'],
				'frame-ancestors': ['none'],
				'form-action': ['self']
			}
		}
	}
};

export default config;
