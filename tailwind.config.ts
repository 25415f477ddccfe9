/**
 * Sheaf's theme: the single source for palette, type scale and radii.
 *
 * Tailwind v4 reads this file through `@config "../../tailwind.config.ts"` in
 * web/styles/app.css. Raw scales (straw, field, soil, rust, slate) are fixed colours;
 * the semantic colours (canvas, surface, ink, accent…) point at CSS variables that
 * app.css sets for the light theme and for `.theme-dark` (the projector / meeting view),
 * so components use `bg-surface text-ink` and switch theme without a `dark:` prefix.
 */
import type { Config } from 'tailwindcss';

/** Warm wheat and straw: highlights, badges, the wordmark's ear. */
const straw = {
  50: '#fbf6e9',
  100: '#f6ebcc',
  200: '#eed79a',
  300: '#e4c06a',
  400: '#d6a743',
  500: '#bf8c2c',
  600: '#9c6f22',
  700: '#7b561f',
  800: '#5f431d',
  900: '#48341a',
};

/** Deep field green: actions, links, the header. */
const field = {
  50: '#edf6f0',
  100: '#d3e9da',
  200: '#a7d2b4',
  300: '#74b487',
  400: '#47955f',
  500: '#2c7a45',
  600: '#216337',
  700: '#1d4f2e',
  800: '#173f25',
  900: '#10301c',
  950: '#0a1f12',
};

/** Soil browns: text, lines and neutral surfaces. */
const soil = {
  50: '#f9f7f4',
  100: '#f1ede7',
  200: '#e2dacf',
  300: '#c9bcab',
  400: '#a69581',
  500: '#85735f',
  600: '#6a5a49',
  700: '#524539',
  800: '#3a3129',
  900: '#26201b',
  950: '#171310',
};

/** Rust: errors and destructive actions. */
const rust = {
  50: '#fcf1ee',
  100: '#f8dcd4',
  200: '#efb5a5',
  500: '#c04a2c',
  600: '#a23b21',
  700: '#83301c',
};

/** Slate blue: neutral information, distinct from the green of actions. */
const slate = {
  50: '#eef3f8',
  100: '#d9e4ef',
  600: '#2f5d8a',
  700: '#264b70',
};

const semantic = (name: string) => `var(--sheaf-${name})`;

export default {
  content: ['./index.html', './web/**/*.{ts,tsx}'],
  theme: {
    extend: {
      colors: {
        straw,
        field,
        soil,
        rust,
        slate,
        canvas: semantic('canvas'),
        surface: semantic('surface'),
        sunken: semantic('sunken'),
        ink: semantic('ink'),
        'ink-muted': semantic('ink-muted'),
        line: semantic('line'),
        'line-strong': semantic('line-strong'),
        accent: semantic('accent'),
        'accent-hover': semantic('accent-hover'),
        'accent-soft': semantic('accent-soft'),
        'on-accent': semantic('on-accent'),
        focus: semantic('focus'),
        danger: semantic('danger'),
        'danger-soft': semantic('danger-soft'),
        info: semantic('info'),
        'info-soft': semantic('info-soft'),
        caution: semantic('caution'),
        'caution-soft': semantic('caution-soft'),
      },
      fontFamily: {
        sans: ['"Inter Variable"', 'Inter', 'system-ui', 'sans-serif'],
      },
      // Sheaf's type scale: a 1.2 ratio from a 1rem body, tuned for phones in the field
      // (nothing smaller than 13 px) and projectors (display sizes).
      fontSize: {
        caption: ['0.8125rem', { lineHeight: '1.15rem', letterSpacing: '0.01em' }],
        label: ['0.875rem', { lineHeight: '1.25rem', fontWeight: '560' }],
        body: ['1rem', { lineHeight: '1.5rem' }],
        lead: ['1.125rem', { lineHeight: '1.7rem' }],
        heading: [
          '1.25rem',
          { lineHeight: '1.75rem', letterSpacing: '-0.01em', fontWeight: '650' },
        ],
        title: ['1.625rem', { lineHeight: '2rem', letterSpacing: '-0.015em', fontWeight: '700' }],
        display: ['2.25rem', { lineHeight: '2.6rem', letterSpacing: '-0.02em', fontWeight: '750' }],
      },
      borderRadius: {
        field: '0.625rem',
        card: '0.875rem',
      },
      boxShadow: {
        card: '0 1px 0 rgb(38 32 27 / 0.04), 0 1px 3px rgb(38 32 27 / 0.08)',
        raised: '0 6px 24px -8px rgb(38 32 27 / 0.25)',
      },
      maxWidth: {
        page: '72rem',
        prose: '42rem',
      },
    },
  },
} satisfies Config;
