import type { Config } from 'tailwindcss';

// The workshop-notebook palette: warm paper, ink navy, copper.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: { DEFAULT: '#f6f0e4', deep: '#ede3d0', card: '#fbf8f1', line: '#dccfb6' },
        ink: { DEFAULT: '#1d2a44', soft: '#3a4763', muted: '#5f6a80', faint: '#8a93a5' },
        copper: { DEFAULT: '#a9572a', dark: '#8a4520', light: '#d98f5f', wash: '#f4e2d4' },
        caution: { DEFAULT: '#8a5a00', wash: '#fbeecb', line: '#e6c56e' },
        danger: { DEFAULT: '#9b2c2c', wash: '#f8e0dc', line: '#e3a59b' },
        ok: { DEFAULT: '#2f6b4f', wash: '#ddefe4', line: '#9cc9b0' },
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        serif: ['Merriweather', 'Georgia', 'serif'],
      },
    },
  },
} satisfies Config;
