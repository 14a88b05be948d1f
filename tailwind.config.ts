import type { Config } from 'tailwindcss';

// One accent of our own (a deep teal), calm neutrals; verdict colours always travel with a word and an icon.
const config: Config = {
  content: ['./app/**/*.{ts,tsx}', './components/**/*.{ts,tsx}', './labels/**/*.{ts,tsx}'],
  darkMode: 'media',
  theme: {
    extend: {
      fontFamily: { sans: ['Karla', 'ui-sans-serif', 'system-ui', 'sans-serif'] },
      colors: {
        accent: { DEFAULT: '#0f766e', strong: '#115e59', soft: '#ccfbf1' },
        verdict: { ok: '#15803d', caution: '#b45309', fail: '#b91c1c' },
      },
    },
  },
};
export default config;
