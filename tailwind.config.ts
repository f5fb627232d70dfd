import type { Config } from 'tailwindcss';

// Drafting-table palette: warm paper, dark ink, one accent (a deep blue-green "layout ink"),
// plus quiet signal colours for success and errors that are always paired with text.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: {
          DEFAULT: '#f4efe4',
          raised: '#fbf8f1',
          sunk: '#ebe4d5',
        },
        ink: {
          DEFAULT: '#1f2a33',
          soft: '#4a5258',
          faint: '#6b6f70',
        },
        rule: {
          DEFAULT: '#d6cdbb',
          strong: '#b3a890',
        },
        accent: {
          DEFAULT: '#1b5e73',
          strong: '#124657',
          wash: '#dde9e9',
        },
        signal: {
          error: '#9c2f1c',
          'error-wash': '#f6e1d9',
          ok: '#35622b',
          'ok-wash': '#e3ecd6',
        },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans Variable"', 'system-ui', 'sans-serif'],
        mono: ['"IBM Plex Mono"', 'ui-monospace', 'monospace'],
      },
      maxWidth: {
        sheet: '72rem',
      },
    },
  },
} satisfies Config;
