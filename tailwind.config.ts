/**
 * Sheaf's theme: the single source for palette, type scale and radii.
 *
 * Tailwind v4 reads this file through `@config "../../tailwind.config.ts"` in
 * web/styles/app.css. Every colour comes from shared/brand/colours.ts (also read by charts,
 * print and mail). Raw scales (straw, field, soil, rust, slate) are fixed colours; the
 * semantic colours (canvas, surface, ink, accent…) point at CSS variables that the plugin
 * below sets for the light theme and for `.theme-dark` (the projector / meeting view),
 * so components use `bg-surface text-ink` and switch theme without a `dark:` prefix.
 */
import type { Config } from 'tailwindcss';
import plugin from 'tailwindcss/plugin';
import {
  DARK,
  LIGHT,
  cssVariables,
  field,
  rust,
  slate,
  soil,
  straw,
  type ThemeTokens,
} from './shared/brand/colours';

const semanticNames = Object.keys(LIGHT) as (keyof ThemeTokens)[];

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
        ...Object.fromEntries(semanticNames.map((name) => [name, semantic(name)])),
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
  // The light theme on :root and the projector theme on .theme-dark, from the shared tokens.
  plugins: [
    plugin(({ addBase }) =>
      addBase({
        ':root': { ...cssVariables(LIGHT), colorScheme: 'light' },
        '.theme-dark': { ...cssVariables(DARK), colorScheme: 'dark' },
      }),
    ),
  ],
} satisfies Config;
