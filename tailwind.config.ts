import type { Config } from 'tailwindcss';

/** Likeness's own palette: warm paper, deep spruce, a clay accent. Components use these names only. */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Work Sans"', 'system-ui', 'sans-serif'],
      },
      colors: {
        ink: { DEFAULT: '#1b2228', muted: '#4f5a63', faint: '#6b757d' },
        paper: { DEFAULT: '#f7f5f1', raised: '#ffffff', sunk: '#eeebe4' },
        line: { DEFAULT: '#dcd7cd', strong: '#b9b2a5' },
        spruce: {
          50: '#eef5f5',
          100: '#d4e7e8',
          200: '#a9ced1',
          500: '#2f6d79',
          600: '#1f4e5a',
          700: '#173d47',
          800: '#102c33',
        },
        clay: { 100: '#f6e4d3', 500: '#c46f28', 600: '#a35a1d' },
        danger: { 50: '#fcecea', 600: '#b3261e', 700: '#8c1d17' },
        success: { 50: '#e8f4ec', 600: '#2e7d4f' },
        caution: { 50: '#fdf3dc', 600: '#8a5a00' },
      },
      borderRadius: { card: '0.875rem', control: '0.5rem' },
      spacing: { touch: '2.75rem' },
      boxShadow: { card: '0 1px 2px rgba(27,34,40,0.06), 0 4px 16px rgba(27,34,40,0.05)' },
    },
  },
} satisfies Config;
