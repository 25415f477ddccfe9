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

// Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg.
const KG_PER_T = 1000;

/**
 * Three sites whose yield rises and levels off with rate, in bu/acre against lb/acre; a metric
 * input in t/ha, or (`frozenInKilograms`) as a pooled snapshot published while metric yields
 * were kg/ha, which carries no yield unit.
 */
function input(unitSystem: 'imperial' | 'metric', frozenInKilograms = false): PooledInput {
  const metric = unitSystem === 'metric';
  const rate = (m: number) => REFERENCE_LB * m * (metric ? KG_PER_LB * ACRES_PER_HA : 1);
  const perUnit = frozenInKilograms ? 1 : KG_PER_T;
  const toUnit = (bu: number) => (metric ? (bu * WHEAT_BUSHEL_KG * ACRES_PER_HA) / perUnit : bu);
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
    ...(frozenInKilograms ? {} : { yieldUnit: metric ? 't/ha' : 'bu/acre' }),
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

  it('gives a metric pooled report in t/ha, with the same optimum and returns as a snapshot frozen in kg/ha', () => {
    const display = reportDisplayUnits(unitsOf(trial('metric')), 'wheat');
    const prices = {
      seedPrice: display.seedPrice.toStored(1.1),
      grainPrice: display.grainPrice.toStored(260),
    };
    const tonnes = buildPooledReport(input('metric'), prices);
    const kilograms = buildPooledReport(input('metric', true), prices);
    expect(tonnes.trial.units.yield).toBe('t/ha');
    // A snapshot published before keeps its own unit when a reader narrows it.
    expect(kilograms.trial.units.yield).toBe('kg/ha');
    // Source: NIST SP 811 (2008 ed.), Appendix B.8 / SI: 1 t = 1000 kg. The analysis is
    // scale-equivariant: means, differences and intervals in t/ha are the kg/ha ones ÷ 1000.
    const a = tonnes.analysis!;
    const b = kilograms.analysis!;
    a.means.forEach((m, i) => expect(m.mean).toBeCloseTo(b.means[i]!.mean / KG_PER_T, 9));
    a.differences.forEach((d, i) => {
      const old = b.differences[i]!;
      expect(d.diff).toBeCloseTo(old.diff / KG_PER_T, 9);
      expect(d.ciLow).toBeCloseTo(old.ciLow / KG_PER_T, 9);
      expect(d.ciHigh).toBeCloseTo(old.ciHigh / KG_PER_T, 9);
    });
    expect(a.rateTest.f).toBeCloseTo(b.rateTest.f, 6);
    // Grain priced per tonne against t/ha, per kg against kg/ha: the same $ per hectare.
    expect(optimum(tonnes)).toBeCloseTo(optimum(kilograms), 6);
    tonnes.economics.forEach((e, i) => {
      const old = kilograms.economics[i]!;
      expect(e.meanYield).toBeCloseTo(old.meanYield / KG_PER_T, 9);
      expect(e.grainValue!).toBeCloseTo(old.grainValue!, 6);
      expect(e.returnOverSeedCost!).toBeCloseTo(old.returnOverSeedCost!, 6);
    });
    expect(tonnes.findings.join(' ')).toMatch(/\d\.\d\d t\/ha/);
  });

  it('reads a metric report published before the unit system was stored by its yield unit', () => {
    const old: ReportUnits = { yield: 'kg/ha', seed: 'kg/ha', money: '$/ha' };
    const display = reportDisplayUnits(old, 'oats');
    // Source: shared/TRADE_FACTS.md §3 (USDA oat bushel 32 lb) and NIST SP 811 (1 lb =
    // 0.453 592 37 kg): $4.00 a bushel is $4.00 per 14.515 kg, $275.58 a tonne.
    expect(display.grainPrice.fromStored(4)).toBeCloseTo(4 / (32 * KG_PER_LB * 0.001), 6);
    expect(display.perArea.unit).toBe('m²');
    // One published in t/ha but without its unit system reads as metric too.
    expect(reportDisplayUnits({ ...old, yield: 't/ha' }, 'oats').system).toBe('metric');
    expect(reportDisplayUnits({ yield: 'bu/acre', seed: 'lb/acre', money: '$/acre' }).system).toBe(
      'imperial',
    );
  });
});
