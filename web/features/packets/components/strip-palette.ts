// Sheaf's strip-map palette: the shared rate ramp (shared/brand/colours.ts) from pale straw to
// deep field green whose lightness falls steadily, so heavier rates read darker in colour, for
// colour-blind readers and in black-and-white print alike. Each rate also gets its own hatch density.
import { RATE_RAMP, RATE_RAMP_LIGHT, soil, white } from '../../../../shared/brand/colours';

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
      const index =
        n === 1 ? RATE_RAMP.length - 1 : Math.round((i * (RATE_RAMP.length - 1)) / (n - 1));
      const fill = RATE_RAMP[index]!;
      const light = RATE_RAMP_LIGHT.has(fill);
      return [
        m,
        {
          fill,
          text: light ? soil[900] : white,
          hatchGap: i === 0 ? 0 : Math.max(4, 14 - i * 3),
          hatchColour: light ? 'rgba(38,32,27,0.28)' : 'rgba(255,255,255,0.22)',
        },
      ];
    }),
  );
}
