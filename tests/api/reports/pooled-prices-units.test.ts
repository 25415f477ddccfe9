// A metric reader types seed and grain prices per kg and per tonne; the page sends the API its own
// $/lb and $/bu. The same field, priced the same, must give the same best rate either way.
import { describe, expect, it } from 'vitest';
import type { PooledReport, ReportUnits } from '../../../shared/schemas/report';
import { reportDisplayUnits } from '../../../shared/units/report-units';
import {
  buildPooledReport,
  unitsOf,
  type PooledInput,
  type TrialFacts,
} from '../../../api/reports/reports.presenter';

// Source: NIST SP 811 (2008), Appendix B.8: 1 lb = 0.453 592 37 kg and 1 ft = 0.3048 m exactly;
// NIST Handbook 44, Appendix C: 1 acre = 43 560 ft². So 1 ha = 2.471 054 acres.
const KG_PER_LB = 0.45359237;
const ACRES_PER_HA = 10_000 / (43_560 * 0.3048 ** 2);
// Source: shared/TRADE_FACTS.md §3 (USDA): a bushel of wheat weighs 60 lb.
const WHEAT_BUSHEL_KG = 60 * KG_PER_LB;

const trial = (unitSystem: 'imperial' | 'metric'): TrialFacts => ({
  id: '00000000-0000-4000-8000-000000000001',
  name: 'Price units',
  question: '',
  crop: 'wheat',
  customCrop: null,
  season: '2027',
  unitSystem,
  referenceRate: 120,
  referenceUnit: 'lb/acre',
  blocksPerSite: 3,
  rowSpacingIn: 7.5,
  thousandKernelWeightG: 38,
  seedPricePerLb: null,
  grainPricePerBu: null,
});

const MULTIPLIERS = [0.25, 0.5, 1, 2];
const REFERENCE_LB = 120;

/** Three sites whose yield rises and levels off with rate, in bu/acre against lb/acre. */
function input(unitSystem: 'imperial' | 'metric'): PooledInput {
  const metric = unitSystem === 'metric';
  const rate = (m: number) => REFERENCE_LB * m * (metric ? KG_PER_LB * ACRES_PER_HA : 1);
  const toUnit = (bu: number) => (metric ? bu * WHEAT_BUSHEL_KG * ACRES_PER_HA : bu);
  const sites = ['North', 'Creek', 'Hill'].map((fieldName, s) => ({
    id: `00000000-0000-4000-8000-00000000001${s}`,
    fieldName,
    soil: 'loam',
    previousCrop: 'beans',
    published: true,
    strips: 12,
    stripsWithYield: 12,
    yields: MULTIPLIERS.flatMap((m, r) =>
      [1, 2, 3].map((block) => {
        const lb = REFERENCE_LB * m;
        // Site × rate and block noise, so the interaction the rate is tested against is not zero.
        const noise = ((block * 7 + r * 3) % 5) - 2 + (((s + 1) * (r + 2)) % 3);
        const bushels = 30 + 5 * s + 0.6 * lb - 0.0018 * lb * lb + noise;
        return { block, rate: String(m), value: toUnit(bushels) };
      }),
    ),
  }));
  return {
    trial: trial(unitSystem),
    rates: MULTIPLIERS.map((m) => ({
      key: String(m),
      label: `${m}×`,
      multiplier: m,
      seedRate: rate(m),
    })),
    sites,
  };
}

const optimum = (report: Pick<PooledReport, 'analysis' | 'analysisError'>) =>
  report.analysis === null
    ? expect.fail(report.analysisError ?? 'no analysis')
    : report.analysis!.curve!.economicOptimum!;

describe('pooled report prices in the trial’s units', () => {
  it('gives the same best rate for a price per kg and tonne as for the same price per lb and bushel', () => {
    const display = reportDisplayUnits(unitsOf(trial('metric')), 'wheat');
    expect([display.seedPrice.unit, display.grainPrice.unit]).toEqual(['$/kg', '$/t']);
    // What a metric reader types, and the same prices worked out by hand per lb and per bushel.
    const seedPerKg = 1.1;
    const grainPerTonne = 260;
    const metric = buildPooledReport(input('metric'), {
      seedPrice: display.seedPrice.toStored(seedPerKg),
      grainPrice: display.grainPrice.toStored(grainPerTonne),
    });
    const imperial = buildPooledReport(input('imperial'), {
      seedPrice: seedPerKg * KG_PER_LB,
      grainPrice: (grainPerTonne * WHEAT_BUSHEL_KG) / 1000,
    });
    expect(optimum(imperial)).toBeGreaterThan(REFERENCE_LB * 0.25);
    // Source: NIST SP 811 (2008), Appendix B.8: lb/acre × 1.120 85 = kg/ha.
    expect(optimum(metric)).toBeCloseTo(optimum(imperial) * KG_PER_LB * ACRES_PER_HA, 6);
    const full = (report: typeof metric) => report.economics.find((e) => e.rate === '1')!;
    // Return over seed cost per hectare is the return per acre × 2.471 acres per hectare.
    expect(full(metric).returnOverSeedCost!).toBeCloseTo(
      full(imperial).returnOverSeedCost! * ACRES_PER_HA,
      6,
    );
    // The findings and the report name the prices in the reader's units.
    expect(metric.findings.join(' ')).toContain('grain at $260.00/t and seed at $1.10/kg');
    expect(metric.findings.join(' ')).not.toMatch(/\/bu\b|\/lb\b/);
    expect(display.seedPrice.fromStored(metric.prices.seedPricePerLb!)).toBeCloseTo(seedPerKg, 10);
    expect(display.grainPrice.fromStored(metric.prices.grainPricePerBu!)).toBeCloseTo(
      grainPerTonne,
      10,
    );
  });

  it('reads a metric report published before the unit system was stored by its yield unit', () => {
    const old: ReportUnits = { yield: 'kg/ha', seed: 'kg/ha', money: '$/ha' };
    const display = reportDisplayUnits(old, 'oats');
    // Source: shared/TRADE_FACTS.md §3 (USDA oat bushel 32 lb) and NIST SP 811 (1 lb =
    // 0.453 592 37 kg): $4.00 a bushel is $4.00 per 14.515 kg, $275.58 a tonne.
    expect(display.grainPrice.fromStored(4)).toBeCloseTo(4 / (32 * KG_PER_LB * 0.001), 6);
    expect(display.perArea.unit).toBe('m²');
  });
});
