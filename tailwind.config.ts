import type { Config } from 'tailwindcss';

// Demold's palette: a warm paper ground, deep ink, and one accent ("ember") kept for the few things
// that must catch the eye (the hold button, the live countdown). Contrast pairs are checked in
// tests/unit/palette.test.ts against the WCAG 2.2 AA ratios.
export const palette = {
  paper: { DEFAULT: '#f7f3ec', deep: '#ede6da', edge: '#d9cfbf' },
  ink: { DEFAULT: '#1f1c1a', soft: '#4a443e', faint: '#6b635a' },
  ember: { DEFAULT: '#a33b20', deep: '#7e2c17', wash: '#f5e3dc' },
  moss: { DEFAULT: '#3f6b4f', wash: '#e3eee6' },
} as const;

const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}', './emails/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: palette,
      fontFamily: {
        display: ['var(--font-display)', 'Georgia', 'serif'],
        sans: ['var(--font-text)', 'system-ui', 'sans-serif'],
      },
      maxWidth: { gallery: '76rem' },
    },
  },
  plugins: [],
};

export default config;
