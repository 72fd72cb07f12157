import type { Config } from 'tailwindcss'

// Knotwork's own design tokens: a warm paper ground, slate ink, a deep
// lichen-green primary, ochre for attention and a brick red for errors.
export default {
  content: [
    './components/**/*.{vue,ts}',
    './layouts/**/*.vue',
    './pages/**/*.vue',
    './app.vue',
    './composables/**/*.ts',
    './utils/**/*.ts',
    './plugins/**/*.ts',
  ],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f7f5f0', raised: '#fffdf9', sunk: '#efebe3', line: '#dcd6ca' },
        ink: {
          900: '#1b2229', 800: '#27313b', 700: '#3a4651', 600: '#52606c',
          500: '#5d6974', 400: '#8e99a3', 300: '#b4bcc3', 200: '#d5dade', 100: '#eceff1',
        },
        lichen: {
          900: '#12332f', 800: '#184440', 700: '#1f5a54', 600: '#2a6f68', 500: '#3b857d',
          400: '#5fa39b', 300: '#8fc2bb', 200: '#c2dfdb', 100: '#e3f0ee', 50: '#f2f8f7',
        },
        ochre: { 700: '#8a5a12', 600: '#a86e17', 500: '#c98a2a', 200: '#f1dcb4', 100: '#f9eed9' },
        brick: { 700: '#8c2f25', 600: '#a63d32', 500: '#c2564a', 200: '#f0c9c3', 100: '#f9e6e3' },
        fern: { 700: '#2f5e2b', 600: '#3f7d3a', 200: '#cfe5cb', 100: '#e8f3e6' },
        plum: { 600: '#6b4a7a', 100: '#efe7f3' },
      },
      fontFamily: {
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
      fontSize: {
        // a 1.2 modular scale from a 15px body
        'xs': ['0.75rem', { lineHeight: '1.1rem' }],
        'sm': ['0.8125rem', { lineHeight: '1.2rem' }],
        'base': ['0.9375rem', { lineHeight: '1.45rem' }],
        'lg': ['1.125rem', { lineHeight: '1.6rem' }],
        'xl': ['1.35rem', { lineHeight: '1.8rem' }],
        '2xl': ['1.62rem', { lineHeight: '2.1rem' }],
        '3xl': ['1.944rem', { lineHeight: '2.4rem' }],
      },
      borderRadius: { DEFAULT: '0.3rem', lg: '0.5rem' },
      boxShadow: {
        card: '0 1px 0 rgba(27,34,41,0.04), 0 1px 3px rgba(27,34,41,0.08)',
      },
    },
  },
  plugins: [],
} satisfies Config
