import type { Config } from 'tailwindcss';

// Loomwright's palette: dark ink on warm paper for daylight in the garage, a deep
// copper accent (the colour of bare wire) and a signal amber for cautions.
// Contrast of ink on paper and paper on copper is above WCAG AA for body text.
export default {
	content: ['./src/**/*.{html,svelte,ts}'],
	theme: {
		extend: {
			colors: {
				paper: { DEFAULT: '#f7f4ee', deep: '#ece6da' },
				ink: { DEFAULT: '#1b1f24', soft: '#3d4651', faint: '#6b7480' },
				copper: { DEFAULT: '#9a4a12', dark: '#73360c', light: '#f3dcc8' },
				signal: { DEFAULT: '#b45309', light: '#fef3c7' },
				fault: { DEFAULT: '#b91c1c', light: '#fee2e2' },
				sound: { DEFAULT: '#15803d', light: '#dcfce7' }
			},
			fontFamily: {
				sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif']
			}
		}
	}
} satisfies Config;
