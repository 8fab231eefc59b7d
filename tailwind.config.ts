import type { Config } from 'tailwindcss';

// Design tokens. Amber is "flash", cobalt is "ambient" in every chart and diagram.
export default {
	content: ['./src/**/*.{html,js,svelte,ts,svx}', './content/**/*.svx'],
	theme: {
		extend: {
			colors: {
				charcoal: {
					950: '#141518',
					900: '#1b1d21',
					850: '#212328',
					800: '#282b31',
					700: '#353942',
					600: '#4a4f5a'
				},
				ink: { DEFAULT: '#e6e4df', muted: '#a9a8a3', faint: '#959490' },
				// 18 % reflectance rendered in sRGB: the neutral behind every photo
				midgrey: '#767676',
				flash: { DEFAULT: '#f0a040', soft: '#f6c27f', deep: '#b86d12' },
				ambient: { DEFAULT: '#3d74e0', soft: '#8fb0f0', deep: '#1f4fae' },
				pass: '#69bd74',
				fail: '#ee7166',
				review: '#c9a63a'
			},
			fontFamily: {
				sans: ['"Inter Variable"', 'system-ui', 'sans-serif'],
				mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace']
			}
		}
	}
} satisfies Config;
