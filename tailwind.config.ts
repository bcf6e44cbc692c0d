import type { Config } from 'tailwindcss';

// Loadproof's own palette: graphite ink on warm paper, a deep "charge" green for
// action and proof, "volt" amber for attention, "fault" red for refusals and danger.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: '#1c2124', soft: '#3a4246', muted: '#626c71', faint: '#8d969a' },
        paper: { DEFAULT: '#f6f4ef', raised: '#ffffff', sunk: '#ebe8e0', line: '#d9d4c8' },
        charge: {
          50: '#eef7f2', 100: '#d5ecdf', 200: '#a9d8bf', 300: '#73bd98', 400: '#3f9d72',
          500: '#217f57', 600: '#176646', 700: '#13523a', 800: '#10412f', 900: '#0b2e21',
        },
        volt: { 50: '#fff8e6', 100: '#feecbf', 300: '#f8c555', 500: '#d99a0b', 700: '#8a5d00' },
        fault: { 50: '#fdf0ee', 100: '#f9d8d2', 500: '#c2412d', 700: '#8c2818' },
        cell: { 50: '#eef3fb', 500: '#3560a8', 700: '#243f70' },
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
      fontSize: { '2xs': ['0.6875rem', { lineHeight: '1rem' }] },
      spacing: { 18: '4.5rem', 88: '22rem' },
      borderRadius: { card: '0.625rem' },
      boxShadow: { card: '0 1px 0 rgba(28,33,36,0.06), 0 1px 3px rgba(28,33,36,0.08)' },
    },
  },
};

export default config;
