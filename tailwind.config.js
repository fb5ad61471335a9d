/**
 * Crownbench's palette and type scale, defined once. Components use these names only.
 * Colours are chosen for WCAG 2.2 AA contrast on the paper background.
 * @type {import('tailwindcss').Config}
 */
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: '#fbfaf6',
				card: '#ffffff',
				ink: { DEFAULT: '#1f2a24', soft: '#45524b', faint: '#6a756e' },
				line: '#d6dbd3',
				leaf: { 50: '#eef6f1', 100: '#d5eadd', 600: '#2f6d4f', 700: '#245a40', 800: '#1b4531' },
				bloom: { 50: '#f4f0fa', 100: '#e6ddf4', 600: '#6a4a9c', 700: '#563b82' },
				alert: { 50: '#fdf0ee', 600: '#b3261e', 700: '#8c1d17' },
				caution: { 50: '#fdf6e7', 600: '#8a5a00' },
				ribbon: { blue: '#1d4f91', red: '#a3232b', white: '#f3f1ea' }
			},
			fontFamily: {
				sans: ['"Source Sans 3"', 'system-ui', 'sans-serif']
			},
			fontSize: {
				small: ['0.875rem', { lineHeight: '1.35rem' }],
				body: ['1rem', { lineHeight: '1.6rem' }],
				lead: ['1.125rem', { lineHeight: '1.75rem' }],
				title: ['1.5rem', { lineHeight: '2rem', fontWeight: '600' }],
				display: ['2rem', { lineHeight: '2.5rem', fontWeight: '700' }]
			},
			minHeight: { touch: '44px' },
			minWidth: { touch: '44px' },
			borderRadius: { card: '0.75rem' }
		}
	}
};
