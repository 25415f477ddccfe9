// Sheaf's strip-map palette: one sequential ramp from pale straw to deep field green whose
// lightness falls steadily, so heavier rates read darker in colour, for colour-blind readers
// and in black-and-white print alike. Each rate also gets its own hatch density.
const RAMP = [
  '#f7efd2',
  '#e6d28e',
  '#c9b35a',
  '#9c9a45',
  '#5f763a',
  '#456638',
  '#2a4a2b',
  '#132b1b',
] as const;
/** Relative luminance above which dark text reads better than white. */
const LIGHT = new Set<string>(['#f7efd2', '#e6d28e', '#c9b35a', '#9c9a45']);

export interface RateStyle {
  fill: string;
  text: string;
  /** Gap between hatch lines in px; 0 = no hatch (lightest rate). */
  hatchGap: number;
  hatchColour: string;
}

/** Styles for rates sorted from lightest (lowest multiplier) to heaviest. */
export function rateStyles(multipliers: readonly number[]): Map<number, RateStyle> {
  const sorted = [...new Set(multipliers)].sort((a, b) => a - b);
  const n = sorted.length;
  return new Map(
    sorted.map((m, i) => {
      const index = n === 1 ? RAMP.length - 1 : Math.round((i * (RAMP.length - 1)) / (n - 1));
      const fill = RAMP[index]!;
      const light = LIGHT.has(fill);
      return [
        m,
        {
          fill,
          text: light ? '#26201b' : '#ffffff',
          hatchGap: i === 0 ? 0 : Math.max(4, 14 - i * 3),
          hatchColour: light ? 'rgba(38,32,27,0.28)' : 'rgba(255,255,255,0.22)',
        },
      ];
    }),
  );
}
