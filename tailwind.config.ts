import type { Config } from 'tailwindcss';

// Squarelaw's own palette: graphite for the drawing, a paper white, and a warm "tungsten"
// and a cool "daylight" accent that echo the kelvin colours drawn on the plan.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	darkMode: 'class',
	theme: {
		extend: {
			fontFamily: {
				sans: ['"Work Sans"', 'system-ui', 'sans-serif']
			},
			colors: {
				paper: { DEFAULT: '#f7f5f0', dim: '#ece8df' },
				graphite: {
					50: '#f4f5f6',
					100: '#e3e6e8',
					200: '#c6ccd1',
					300: '#a0a9b1',
					400: '#76828d',
					500: '#5a6570',
					600: '#46505a',
					700: '#363e46',
					800: '#252b31',
					900: '#171b1f',
					950: '#0e1114'
				},
				tungsten: { DEFAULT: '#d9822b', light: '#f2b872', dark: '#9c5414' },
				daylight: { DEFAULT: '#3d7fb8', light: '#8fbde3', dark: '#24557f' },
				caution: { DEFAULT: '#b8322a', light: '#f3c9c5' }
			}
		}
	}
} satisfies Config;
