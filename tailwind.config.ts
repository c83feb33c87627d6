import forms from '@tailwindcss/forms';
import type { Config } from 'tailwindcss';

/**
 * Thermalith's theme tokens. The palette runs from cool slate ("basement") through a warm
 * ochre ("ember") to a deep magma red; it is our own, chosen so heat reads as warmth without
 * borrowing any other product's scheme. Loaded from src/app.css with Tailwind 4's `@config`.
 */
export default {
	content: ['./src/**/*.{html,svelte,ts,js}'],
	theme: {
		extend: {
			colors: {
				basement: {
					50: '#f4f6f7',
					100: '#e3e8eb',
					200: '#c7d0d6',
					300: '#9fafb9',
					400: '#708694',
					500: '#526877',
					600: '#415363',
					700: '#364452',
					800: '#2b3642',
					900: '#1c242d',
					950: '#11161c'
				},
				ember: {
					50: '#fdf7ec',
					100: '#f9e8c9',
					200: '#f2cf8f',
					300: '#eab255',
					400: '#e3962f',
					500: '#d2771c',
					600: '#b45a16',
					700: '#904217',
					800: '#75361a',
					900: '#612e19'
				},
				magma: {
					500: '#c2332b',
					600: '#a3241f',
					700: '#7f1a18'
				},
				lichen: {
					500: '#4f8a5b',
					600: '#3e6f48'
				}
			},
			fontFamily: {
				sans: ['Lato', 'ui-sans-serif', 'system-ui', 'sans-serif'],
				mono: ['ui-monospace', 'SFMono-Regular', 'Menlo', 'monospace']
			},
			fontSize: {
				// A 1.2 (minor third) type scale from a 16 px base.
				'2xs': ['0.694rem', { lineHeight: '1rem' }],
				xs: ['0.833rem', { lineHeight: '1.2rem' }],
				sm: ['0.9rem', { lineHeight: '1.35rem' }],
				base: ['1rem', { lineHeight: '1.55rem' }],
				lg: ['1.2rem', { lineHeight: '1.75rem' }],
				xl: ['1.44rem', { lineHeight: '2rem' }],
				'2xl': ['1.728rem', { lineHeight: '2.25rem' }],
				'3xl': ['2.074rem', { lineHeight: '2.5rem' }],
				'4xl': ['2.488rem', { lineHeight: '2.9rem' }]
			}
		}
	},
	plugins: [forms]
} satisfies Config;
