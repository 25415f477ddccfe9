import { describe, expect, it } from 'vitest';
import { analyzeSite } from '../../../shared/analysis/index';
import { EMPTY_OBSERVATION, type ObservationValues } from '../../../shared/schemas/observation';
import { countPerArea, stripYield } from '../../../shared/units/yield';
import {
  cropFacts,
  deriveStripValues,
  outlierWarning,
  plausibilityWarnings,
  recordedGroups,
  yieldOutliers,
  type StripContext,
} from '../../../shared/units/strip-derived';

const oats = (system: 'imperial' | 'metric' = 'imperial'): StripContext => ({
  unitSystem: system,
  crop: cropFacts('oats', null),
  rowSpacingIn: 8,
  thousandKernelWeightG: 32,
  referenceRate: 90,
  referenceUnit: 'lb/acre',
  multiplier: 1,
  seedPricePerLb: 0.5,
  grainPricePerBu: 4,
});

const values = (patch: Partial<ObservationValues>): ObservationValues => ({
  ...EMPTY_OBSERVATION,
  ...patch,
});

describe('deriveStripValues', () => {
  it('matches a hand-worked imperial oat strip', () => {
    const derived = deriveStripValues(
      values({
        standCounts: [45, 48, 42],
        standRowLength: 3,
        tillerPlants: 10,
        tillerCount: 25,
        headCounts: [60, 66],
        headRowLength: 3,
        grainWeight: 7.4,
        harvestRows: 4,
        harvestLength: 50,
        moisturePct: 13.2,
      }),
      oats(),
    );
    // Source: PSU-WS (extension.psu.edu/wheat-stand-assessment): plants/ft² = count in 3 ft × 4 ÷ row width (in).
    // Mean count 45 in 3 ft of 8-inch row → 45 × 4 ÷ 8 = 22.5 plants/ft².
    expect(derived.plantsPerSquareFoot).toBeCloseTo(22.5, 10);
    expect(derived.headsPerSquareFoot).toBeCloseTo((63 * 4) / 8, 10); // 31.5, same PSU-WS rule
    expect(derived.tillersPerPlant).toBe(2.5);
    // Source: EDIS AG442: weight × (100 − measured %) ÷ (100 − standard %); oats standard 14 % [UW-R].
    // 7.4 lb × 86.8 ÷ 86 = 7.46884 lb dry-basis; area 4 × 8/12 ft × 50 ft = 133.33 ft²;
    // × 43,560 ft²/acre [USU] ÷ 133.33 = 2,440.07 lb/acre; ÷ 32 lb/bu (USDA oat bushel [OSU-503]) = 76.25 bu/acre.
    expect(derived.harvestedAreaSquareFeet).toBeCloseTo(133.333, 3);
    expect(derived.yieldBushelsPerAcre).toBeCloseTo(76.25, 2);
    // Source: NDSU-MC: 1 bu/acre of oats = 35.87 kg/ha (rounded on the card) → 76.25 × 35.87 ≈ 2,735.
    expect(derived.yieldKilogramsPerHectare! / derived.yieldBushelsPerAcre!).toBeCloseTo(35.87, 2);
    // Seeds/ft² at 90 lb/acre and 32 g TKW: 90 × 453.59237 g ÷ 0.032 g ÷ 43,560 ft² = 29.287 (derived);
    // establishment 22.5 ÷ 29.29 = 76.8 %.
    expect(derived.targetSeedsPerSquareFoot).toBeCloseTo(29.287, 3);
    expect(derived.establishmentPercent).toBeCloseTo(76.83, 2);
  });

  it('agrees with the analysis engine’s own yield and per-area conversions', () => {
    const obs = values({
      standCounts: [40, 44, 41, 39],
      standRowLength: 3,
      grainWeight: 9.1,
      harvestRows: 6,
      harvestLength: 40,
      moisturePct: 16.4,
    });
    const derived = deriveStripValues(obs, oats());
    const engine = stripYield({
      grainGrams: 9.1 * 453.59237,
      areaSquareFeet: 6 * (8 / 12) * 40,
      moisturePercent: 16.4,
      crop: 'oats',
    });
    expect(derived.yieldBushelsPerAcre).toBeCloseTo(engine.bushelsPerAcre, 9);
    expect(derived.yieldKilogramsPerHectare).toBeCloseTo(engine.kilogramsPerHectare, 6);
    const perArea = countPerArea({
      counts: [40, 44, 41, 39],
      rowLengthFeet: 3,
      rowSpacingInches: 8,
    });
    expect(derived.plantsPerSquareFoot).toBeCloseTo(perArea.perSquareFoot, 12);
    expect(derived.plantsPerSquareMetre).toBeCloseTo(perArea.perSquareMetre, 9);
  });

  it('converts metric entries (metres, kilograms, square metres) in the same place', () => {
    const derived = deriveStripValues(
      values({
        standCounts: [30],
        standRowLength: 1,
        grainWeight: 3.2,
        harvestArea: 20,
        moisturePct: 14,
      }),
      oats('metric'),
    );
    // Derived from TRADE_FACTS §2: plants/m² = plants per m of row ÷ spacing (m); 30 ÷ 0.2032 = 147.64.
    expect(derived.plantsPerSquareMetre).toBeCloseTo(147.64, 2);
    // 3.2 kg on 20 m² at the standard moisture = 1,600 kg/ha; ÷ 35.87 (NDSU-MC, oats) ≈ 44.6 bu/acre.
    expect(derived.yieldKilogramsPerHectare).toBeCloseTo(1600, 6);
    expect(derived.yieldBushelsPerAcre).toBeCloseTo(1600 / 35.87, 1);
  });

  it('leaves values null when their inputs are missing, never throwing', () => {
    const derived = deriveStripValues(values({ grainWeight: 5 }), oats());
    expect(derived.yieldBushelsPerAcre).toBeNull();
    expect(derived.plantsPerSquareFoot).toBeNull();
    expect(derived.tillersPerPlant).toBeNull();
  });
});

describe('plausibilityWarnings', () => {
  it('warns about establishment over 100 %, fewer heads than plants, moisture outside 8–35 % and an unusual yield', () => {
    const obs = values({
      standCounts: [90],
      standRowLength: 3,
      headCounts: [40],
      headRowLength: 3,
      grainWeight: 40,
      harvestRows: 4,
      harvestLength: 50,
      moisturePct: 40,
    });
    const derived = deriveStripValues(obs, oats());
    const warnings = plausibilityWarnings(obs, derived, oats().crop);
    expect(warnings.join('\n')).toMatch(/Establishment is \d+ %/);
    expect(warnings.join('\n')).toMatch(/Fewer heads than plants/);
    expect(warnings.join('\n')).toMatch(/moisture 40 % is outside 8–35 %/);
    expect(warnings.join('\n')).toMatch(/far outside the usual/);
  });

  it('stays quiet for a normal strip', () => {
    const obs = values({
      standCounts: [45],
      standRowLength: 3,
      headCounts: [60],
      headRowLength: 3,
      grainWeight: 7.4,
      harvestRows: 4,
      harvestLength: 50,
      moisturePct: 13.2,
    });
    expect(plausibilityWarnings(obs, deriveStripValues(obs, oats()), oats().crop)).toEqual([]);
  });
});

describe('recordedGroups and yieldOutliers', () => {
  it('counts a group as in only when its measurement and its row length or area are there', () => {
    expect(recordedGroups(values({ standCounts: [3] }))).toMatchObject({ stand: false });
    expect(
      recordedGroups(
        values({
          standCounts: [3],
          standRowLength: 3,
          grainWeight: 2,
          moisturePct: 13,
          harvestArea: 100,
        }),
      ),
    ).toEqual({ stand: true, tillers: false, heads: false, yield: true });
  });

  it('flags a strip by the Bonferroni outlier test of the analysis, not by |studentized residual| > 3', () => {
    const noise = [
      0.3, -0.2, 0.1, -0.4, 0.2, 0.0, -0.1, 0.3, -0.3, 0.2, 0.1, -0.2, 0.0, 0.4, -0.1, -0.2, 0.3,
      0.1,
    ];
    const site = (spike: number) => {
      const strips = [];
      let i = 0;
      for (let block = 1; block <= 6; block += 1) {
        for (const rate of ['half', 'full', 'double']) {
          const value = 60 + (rate === 'half' ? -5 : rate === 'double' ? 2 : 0) + block + noise[i]!;
          strips.push({
            key: `${block}-${rate}`,
            block,
            rate,
            value: block === 3 && rate === 'full' ? value + spike : value,
          });
          i += 1;
        }
      }
      return strips;
    };
    // Source: R 4.2.2, car 3.1.1 outlierTest(lm(value ~ block + rate), cutoff = Inf) on this
    // site (block and rate as factors, the same noise; fixtures/reference/strip-outliers.R):
    // spike 40 gives rstudent 118.8627, Bonferroni p 1.93019e-14; spike 0.9 gives rstudent
    // 3.596541, Bonferroni p 0.1040298.
    const spiked = yieldOutliers(site(40), analyzeSite);
    expect([...spiked.keys()]).toEqual(['3-full']);
    expect(spiked.get('3-full')! / 1.93019e-14).toBeCloseTo(1, 5);
    // |rstudent| 3.6 is above the old cut-off of 3, but not beyond chance over 18 strips.
    expect(yieldOutliers(site(0.9), analyzeSite).size).toBe(0);
    expect(yieldOutliers(site(40).slice(0, 3), analyzeSite).size).toBe(0);
    expect(outlierWarning(spiked.get('3-full')!)).toBe(
      "This strip's yield is further from what its block and rate predict than chance explains, even allowing for checking every strip (outlier test, Bonferroni-adjusted p < 0.001): check the weight, moisture and harvested area.",
    );
    expect(outlierWarning(0.0042)).toMatch(/Bonferroni-adjusted p = 0\.004\)/);
  });
});
