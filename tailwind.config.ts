import type { Config } from 'tailwindcss';

/**
 * Binwright's theme (see docs/design.md). Loaded by src/index.css through `@config`.
 * Colours are named by their job, not by hue.
 */
export default {
  content: ['./index.html', './src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      fontFamily: {
        sans: ['"Source Sans 3"', 'system-ui', 'sans-serif'],
        mono: ['ui-monospace', '"DejaVu Sans Mono"', 'monospace'],
      },
      colors: {
        paper: '#f5f4ef',
        panel: '#ffffff',
        rule: '#d9d6cc',
        // faint, copper, pass and hold darkened for WCAG 2.1 AA contrast (4.5:1 for small text, on
        // panel, paper and the -light tints); checked by axe-core in tests/e2e/a11y.test.ts.
        ink: { DEFAULT: '#1f2a33', soft: '#4a5661', faint: '#5f6870' },
        slate: { bar: '#23303b', hover: '#2f3f4c' },
        copper: { DEFAULT: '#a0571f', dark: '#8f4c1d', light: '#f6e6d8' },
        pass: { DEFAULT: '#2a6f40', light: '#e2f1e6' },
        fail: { DEFAULT: '#b3261e', light: '#fbe4e1' },
        hold: { DEFAULT: '#855b00', light: '#fbf0d2' },
        info: { DEFAULT: '#2b5f8f', light: '#e2edf7' },
      },
      fontSize: {
        xs: ['0.75rem', { lineHeight: '1rem' }],
        sm: ['0.8125rem', { lineHeight: '1.25rem' }],
        base: ['0.9375rem', { lineHeight: '1.4rem' }],
        lg: ['1.125rem', { lineHeight: '1.6rem' }],
        xl: ['1.375rem', { lineHeight: '1.8rem' }],
        '2xl': ['1.75rem', { lineHeight: '2.2rem' }],
      },
    },
  },
} satisfies Config;
