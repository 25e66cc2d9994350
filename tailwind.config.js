/** Inchwarden's own palette: a calm felt board, two strong side colours, one signal colour. */
/** @type {import('tailwindcss').Config} */
export default {
	content: ['./src/**/*.{html,js,svelte,ts}'],
	theme: {
		extend: {
			fontFamily: { sans: ['Inter', 'system-ui', 'sans-serif'] },
			colors: {
				felt: { 50: '#f3f5f0', 100: '#e3e8dc', 200: '#c8d2bb', 500: '#6f7f5c', 700: '#45533a', 900: '#232b1d' },
				ink: { 500: '#3d4450', 700: '#262b33', 900: '#14171c' },
				brass: { 300: '#f0d58a', 500: '#c99a2e', 700: '#8a6717' },
				signal: { 500: '#d9480f', 700: '#a3360b' },
				sidea: '#1f5fa8',
				sideb: '#b42318'
			},
			minHeight: { touch: '44px' },
			minWidth: { touch: '44px' }
		}
	}
};
