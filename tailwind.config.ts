import type { Config } from 'tailwindcss';

// Tidewright's palette: deep water ink, chart-paper sand, a copper signal colour
// for actions and a kelp green for healthy figures. Text takes abyss-500 or darker,
// copper-600 or darker, kelp-500 or darker, or flare-500: each at least 4.5:1 on white
// and on sand-50 (WCAG 2.1 SC 1.4.3). abyss-300, copper-400/500 and kelp-400 are for
// lines, fills and text on the dark abyss-800/900 grounds only.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				abyss: { 50: '#eef4f7', 100: '#d5e3ea', 300: '#8fb0c0', 500: '#3e6e85', 600: '#2d5a6f', 700: '#1d4357', 800: '#143244', 900: '#0c2130' },
				sand: { 50: '#fbf9f4', 100: '#f4efe3', 200: '#e8dfc9', 400: '#c9b88f' },
				copper: { 400: '#e08a5c', 500: '#c8643b', 600: '#a94e2a', 700: '#8a3f22' },
				kelp: { 400: '#5aa58f', 500: '#2f7d6d', 600: '#256457' },
				flare: { 500: '#b3322f' }
			},
			fontFamily: {
				display: ['Fraunces', 'Georgia', 'serif'],
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
				mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace']
			}
		}
	}
} satisfies Config;
