// Sheaf's colours as design tokens: the one place a hex value is written, read by Tailwind (and
// through it the CSS variables), the report charts, the field packet's print styles, the server's
// PDF styles and the e-mails.

/** Warm wheat and straw: highlights, badges, the wordmark's ear. */
export const straw = {
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
} as const;

/** Field green: the brand colour (700), actions and the projector ground (900–950). */
export const field = {
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
} as const;

/** Soil browns: ink, muted text and lines. */
export const soil = {
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
} as const;

/** Rust: errors and the economic optimum. */
export const rust = {
  50: '#fcf1ee',
  100: '#f8dcd4',
  200: '#efb5a5',
  500: '#c04a2c',
  600: '#a23b21',
  700: '#83301c',
} as const;

/** Slate blue: information and the agronomic optimum. */
export const slate = {
  50: '#eef3f8',
  100: '#d9e4ef',
  200: '#b3c8de',
  600: '#2f5d8a',
  700: '#264b70',
} as const;

export const white = '#ffffff';

/** The brand green: buttons, headings in print, the mail's call to action. */
export const BRAND = field[700];

/** Semantic colours one theme sets; components and print read these names, never a scale. */
export interface ThemeTokens {
  canvas: string;
  surface: string;
  sunken: string;
  ink: string;
  'ink-muted': string;
  line: string;
  'line-strong': string;
  accent: string;
  'accent-hover': string;
  'accent-soft': string;
  'on-accent': string;
  focus: string;
  danger: string;
  'danger-soft': string;
  info: string;
  'info-soft': string;
  caution: string;
  'caution-soft': string;
  /** Fields a person cannot change: a sunken ground and muted text, never the enabled look. */
  'disabled-bg': string;
  'disabled-ink': string;
}

export const LIGHT: ThemeTokens = {
  canvas: '#faf7f0',
  surface: white,
  sunken: soil[100],
  ink: soil[900],
  'ink-muted': soil[600],
  line: soil[200],
  'line-strong': '#938270',
  accent: field[700],
  'accent-hover': field[800],
  'accent-soft': field[50],
  'on-accent': white,
  focus: straw[600],
  danger: rust[600],
  'danger-soft': rust[50],
  info: slate[700],
  'info-soft': slate[50],
  caution: straw[700],
  'caution-soft': straw[50],
  'disabled-bg': soil[100],
  'disabled-ink': soil[600],
};

/** The meeting view on a projector: deep field-green ground, straw accents. */
export const DARK: ThemeTokens = {
  canvas: field[950],
  surface: field[900],
  sunken: '#0d2616',
  ink: straw[50],
  'ink-muted': soil[300],
  line: '#2b4a35',
  'line-strong': field[300],
  accent: straw[300],
  'accent-hover': straw[200],
  'accent-soft': '#1b3a25',
  'on-accent': soil[950],
  focus: straw[200],
  danger: rust[200],
  'danger-soft': '#3a1a12',
  info: slate[100],
  'info-soft': '#1a2c3d',
  caution: straw[200],
  'caution-soft': '#33280f',
  'disabled-bg': '#0d2616',
  'disabled-ink': soil[400],
};

/** `--sheaf-<name>` custom properties for one theme (the web app's CSS variables). */
export function cssVariables(theme: ThemeTokens): Record<string, string> {
  return Object.fromEntries(
    Object.entries(theme).map(([name, value]) => [`--sheaf-${name}`, value]),
  );
}

/**
 * What each chart colour means, the same in the report, the PDF and the meeting view: the
 * hue of a role never changes between themes, only its lightness (so it reads on the ground).
 */
export interface ChartColours {
  ink: string;
  muted: string;
  line: string;
  background: string;
  /** Rate means, their intervals and the pooled estimate. */
  estimate: string;
  /** Bars of yield components. */
  bar: string;
  /** The fitted response curve. */
  curve: string;
  /** The agronomic optimum (highest yield) line. */
  agronomicOptimum: string;
  /** The economic optimum (best return over seed) line. */
  economicOptimum: string;
}

export const LIGHT_CHART: ChartColours = {
  ink: soil[900],
  muted: soil[600],
  line: soil[200],
  background: white,
  estimate: field[700],
  bar: straw[500],
  curve: field[500],
  agronomicOptimum: slate[600],
  economicOptimum: rust[500],
};

export const DARK_CHART: ChartColours = {
  ink: straw[50],
  muted: soil[300],
  line: '#2b4a35',
  background: field[900],
  estimate: field[200],
  bar: straw[300],
  curve: field[300],
  agronomicOptimum: slate[200],
  economicOptimum: rust[200],
};

/**
 * The strip map's rate ramp, pale straw to deep field green with lightness falling steadily,
 * so heavier rates read darker for colour-blind readers and in black-and-white print.
 */
export const RATE_RAMP = [
  '#f7efd2',
  '#e6d28e',
  '#c9b35a',
  '#9c9a45',
  '#5f763a',
  '#456638',
  '#2a4a2b',
  '#132b1b',
] as const;

/**
 * The yield map's ramp, pale straw (low yield) to deep field green (high), taken from the brand
 * scales so the heat map on screen and in the PDF reads in Sheaf's own colours.
 */
export const YIELD_RAMP = [
  straw[100],
  straw[300],
  field[300],
  field[500],
  field[700],
  field[900],
] as const;

/** Ramp entries light enough that dark text reads better than white on them. */
export const RATE_RAMP_LIGHT: ReadonlySet<string> = new Set(RATE_RAMP.slice(0, 4));

/** Colours for printed pages (field packet, report PDF) and e-mails. */
export const PRINT = {
  paper: white,
  ink: soil[900],
  muted: soil[600],
  line: soil[200],
  headerGround: soil[100],
  heading: field[700],
  eyebrow: straw[700],
  rule: straw[300],
  noteRule: straw[500],
  noteGround: straw[50],
  button: BRAND,
  onButton: white,
} as const;
