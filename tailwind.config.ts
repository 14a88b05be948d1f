import type { Config } from 'tailwindcss';

// One accent of our own (a deep teal), calm neutrals; verdict colours always travel with a word and an icon.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}', './labels/**/*.{ts,tsx}'],
  darkMode: 'media',
  theme: {
    extend: {
      fontFamily: { sans: ['Karla', 'ui-sans-serif', 'system-ui', 'sans-serif'] },
      colors: {
        // `ink` is the text on the accent (primary buttons) in both schemes; tests/unit/ui/contrast.test.ts
        // holds each pair to WCAG 2.2 AA (4.5:1), hover included.
        accent: { DEFAULT: '#0f766e', strong: '#115e59', soft: '#ccfbf1', ink: '#ffffff' },
        verdict: { ok: '#15803d', caution: '#b45309', fail: '#b91c1c' },
      },
    },
  },
};
export default config;
