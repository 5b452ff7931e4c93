import type { Config } from 'tailwindcss'

/** Boreline's own palette: "slate steel" neutrals, a copper accent (the colour of a bedded-in disc edge)
 * and semantic colours for verdicts. Tokens are named for their job, not their hue. */
export default {
  content: ['./app/**/*.{vue,ts}'],
  theme: {
    extend: {
      colors: {
        ink: { DEFAULT: '#1b2430', soft: '#3d4a5c', muted: '#5b6878' },
        paper: { DEFAULT: '#f6f4f0', raised: '#ffffff', sunk: '#ebe7df' },
        line: { DEFAULT: '#d3cdc2', strong: '#a79f91' },
        copper: { 50: '#fbf3ec', 100: '#f3dfcc', 300: '#dba57a', 500: '#b5652e', 600: '#9a5225', 700: '#7c4120', 900: '#3f2212' },
        steel: { 50: '#eef2f6', 100: '#d8e0e9', 300: '#9fb0c3', 500: '#587089', 700: '#34465a', 900: '#18222d' },
        verdict: { ok: '#1f7a4d', okbg: '#e3f3ea', advise: '#8a5a00', advisebg: '#fbf0d9', fail: '#b42318', failbg: '#fde8e6' },
      },
      fontFamily: {
        sans: ['"Inter Variable"', 'Inter', 'ui-sans-serif', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono Variable"', '"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
      borderRadius: { card: '0.625rem' },
      boxShadow: { card: '0 1px 2px rgba(27,36,48,.06), 0 2px 8px rgba(27,36,48,.05)' },
    },
  },
} satisfies Config
