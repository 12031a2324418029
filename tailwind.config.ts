import type { Config } from 'tailwindcss';

// The workshop-notebook palette: warm paper, ink navy, copper.
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      // Each colour is a CSS variable (src/styles/index.css) so dark mode swaps the palette in one place.
      colors: {
        paper: { DEFAULT: 'var(--tw-paper)', deep: 'var(--tw-paper-deep)', card: 'var(--tw-paper-card)', line: 'var(--tw-paper-line)' },
        ink: { DEFAULT: 'var(--tw-ink)', soft: 'var(--tw-ink-soft)', muted: 'var(--tw-ink-muted)', faint: 'var(--tw-ink-faint)' },
        copper: { DEFAULT: 'var(--tw-copper)', dark: 'var(--tw-copper-dark)', light: 'var(--tw-copper-light)', wash: 'var(--tw-copper-wash)' },
        caution: { DEFAULT: 'var(--tw-caution)', wash: 'var(--tw-caution-wash)', line: 'var(--tw-caution-line)' },
        danger: { DEFAULT: 'var(--tw-danger)', wash: 'var(--tw-danger-wash)', line: 'var(--tw-danger-line)' },
        ok: { DEFAULT: 'var(--tw-ok)', wash: 'var(--tw-ok-wash)', line: 'var(--tw-ok-line)' },
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        serif: ['Merriweather', 'Georgia', 'serif'],
      },
    },
  },
} satisfies Config;
