import type { Config } from 'tailwindcss';

// Seamwell's own palette: a calm teal for action, warm sand for surfaces, and three
// outcome tones chosen for contrast (WCAG 2.2 AA on white) rather than traffic-light red/green.
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				ink: { DEFAULT: '#1f2a30', soft: '#4a5a62', faint: '#6b7b83' },
				tide: {
					50: '#eef7f6',
					100: '#d5ecea',
					200: '#a9d8d4',
					500: '#2f8a84',
					600: '#21706b',
					700: '#185955',
					900: '#0d3533'
				},
				sand: { 50: '#fbf8f3', 100: '#f4eee3', 200: '#e7dcc8', 400: '#bfa77e' },
				outcome: {
					clear: '#1d6b4f',
					'clear-bg': '#e3f2ec',
					watch: '#7a5200',
					'watch-bg': '#fbf0d9',
					refer: '#9b2d20',
					'refer-bg': '#fbe7e3'
				}
			},
			fontFamily: {
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif']
			}
		}
	}
} satisfies Config;
