import type { Config } from 'tailwindcss';

// Modewright's own look: warm paper sheets, dark ink, thin rules and one accent, a deep
// oxidised-copper green. Loaded from web/src/index.css with `@config`.
export default {
  content: ['./web/index.html', './web/src/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        paper: {
          DEFAULT: '#f4f0e6',
          sheet: '#fbf9f3',
          deep: '#e9e3d4',
        },
        ink: {
          DEFAULT: '#1d2126',
          soft: '#4a4f57',
          faint: '#6f7379',
        },
        rule: {
          DEFAULT: '#d6cfbf',
          strong: '#a89f8b',
        },
        accent: {
          DEFAULT: '#1f6b5c',
          strong: '#154d42',
          soft: '#dcebe5',
        },
        pass: {
          DEFAULT: '#2d6a2f',
          soft: '#e1eedb',
        },
        // Work under way that needs attention but is not wrong: "in check", units in the editor.
        caution: {
          DEFAULT: '#8a4b12',
          soft: '#f3e7d8',
        },
        fail: {
          DEFAULT: '#a3261b',
          soft: '#f6e0dc',
        },
      },
      fontFamily: {
        sans: ['"IBM Plex Sans"', 'system-ui', 'sans-serif'],
        mono: ['"JetBrains Mono"', 'ui-monospace', 'monospace'],
      },
      boxShadow: {
        sheet: '0 1px 0 rgba(29, 33, 38, 0.06), 0 1px 3px rgba(29, 33, 38, 0.08)',
      },
    },
  },
} satisfies Config;
