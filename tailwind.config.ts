import type { Config } from 'tailwindcss';

// Cornicle's own palette: a sap green for the brand, a honey amber for warnings, a warm soil
// neutral. Level colours are chosen from a colour-blind-safe ramp and always paired with a
// label and a pattern, never shown as colour alone.
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: {
				sans: ['"Inter Variable"', 'system-ui', 'sans-serif']
			},
			colors: {
				sap: {
					50: '#f1f8f3',
					100: '#dcefe2',
					200: '#b9dec6',
					300: '#8cc5a3',
					400: '#5ea87e',
					500: '#3d8c62',
					600: '#2c704d',
					700: '#245a3f',
					800: '#1f4834',
					900: '#1a3b2b',
					950: '#0d2118'
				},
				honey: {
					50: '#fdf8ec',
					100: '#f9ecc9',
					200: '#f2d68e',
					300: '#ebbd55',
					400: '#e5a52f',
					500: '#d5861b',
					600: '#b86614',
					700: '#934a15',
					800: '#783b18',
					900: '#633217'
				},
				soil: {
					50: '#f8f6f3',
					100: '#eeeae3',
					200: '#ddd4c6',
					300: '#c6b8a2',
					400: '#ad987d',
					500: '#9a8365',
					600: '#8d7459',
					700: '#755f4b',
					800: '#614f41',
					900: '#4f4136',
					950: '#2a211b'
				},
				level: {
					calm: '#4a9a6e',
					stirring: '#e2b43c',
					action: '#d7711f',
					severe: '#8e2a5c'
				}
			},
			fontSize: {
				'2xs': ['0.6875rem', { lineHeight: '1rem' }]
			}
		}
	},
	plugins: []
} satisfies Config;
