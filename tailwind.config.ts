import type { Config } from 'tailwindcss';
import plugin from 'tailwindcss/plugin';

/**
 * Phasewright's look, in one place. Colours are named for what they do on a workshop drawing:
 * paper and ink, the blue of layout dye for the accent, amber for caution marks.
 * Each colour has a light and a dark value; pages use the names only, and the theme switch
 * (data-theme on <html>) swaps the values through CSS variables written by the plugin below.
 */
export const palette = {
	paper: { light: '#f6f5f1', dark: '#121416' },
	panel: { light: '#ffffff', dark: '#1b1e22' },
	sunken: { light: '#ecebe5', dark: '#0c0e10' },
	ink: { light: '#16181b', dark: '#ecebe6' },
	'ink-muted': { light: '#4f555c', dark: '#a6abb1' },
	line: { light: '#cfcdc4', dark: '#343a41' },
	layout: { light: '#1d47b0', dark: '#86a9ff' },
	'on-layout': { light: '#ffffff', dark: '#0a1022' },
	mark: { light: '#8a5200', dark: '#f0b44e' },
	'mark-soft': { light: '#fbefd7', dark: '#36280f' },
	danger: { light: '#b3261e', dark: '#ff8f85' },
	ok: { light: '#1c7338', dark: '#72d494' }
} as const;

type Mode = 'light' | 'dark';
const vars = (mode: Mode) => Object.fromEntries(Object.entries(palette).map(([name, v]) => [`--pw-${name}`, v[mode]]));

export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: Object.fromEntries(Object.keys(palette).map((name) => [name, `var(--pw-${name})`])),
			fontFamily: {
				sans: ['Inter', 'ui-sans-serif', 'system-ui', 'sans-serif'],
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace']
			},
			spacing: {
				// 44 px: the smallest touch target for gloved or greasy fingers (WCAG 2.5.5).
				tap: '2.75rem',
				gutter: '1.25rem',
				rail: '16rem'
			},
			maxWidth: { page: '72rem' },
			borderRadius: { part: '0.375rem' }
		}
	},
	plugins: [
		plugin(({ addBase }) => {
			addBase({
				':root': { ...vars('light'), 'color-scheme': 'light' },
				':root[data-theme="dark"]': { ...vars('dark'), 'color-scheme': 'dark' },
				'@media (prefers-color-scheme: dark)': {
					':root[data-theme="system"]': { ...vars('dark'), 'color-scheme': 'dark' }
				}
			});
		})
	]
} satisfies Config;
