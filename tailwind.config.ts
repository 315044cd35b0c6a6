import type { Config } from 'tailwindcss';

// Pincer's palette and type. Loaded from src/app.css with @config so that Tailwind 4
// generates utilities such as bg-paper, text-ink, text-brass, text-sage and text-brick.
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: { DEFAULT: '#f7f1e3', deep: '#efe6d2', edge: '#ddd0b4' },
				ink: { DEFAULT: '#23201b', soft: '#4a443a', faint: '#7a7163' },
				brass: { DEFAULT: '#a87b2c', deep: '#87611d', light: '#e6cf9c' },
				sage: { DEFAULT: '#5c7f5a', deep: '#436343', light: '#dbe6d3' },
				brick: { DEFAULT: '#a64b34', deep: '#833725', light: '#f1d7cd' }
			},
			fontFamily: {
				sans: ['Inter', 'system-ui', 'sans-serif'],
				mono: ['"Roboto Mono"', 'ui-monospace', 'monospace']
			}
		}
	}
} satisfies Config;
