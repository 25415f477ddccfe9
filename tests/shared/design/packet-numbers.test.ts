// The field packet's seeder-check and counting numbers, in both unit systems, checked against
// hand computations with the published unit definitions.
import { describe, expect, it } from 'vitest';
import {
  calibrationRows,
  countingNumbers,
  packetUnits,
} from '../../../shared/design/packet-numbers';

/** An invented design: 300 seeds/m² (and half that) in 8-inch rows, 40 g per 1,000 seeds. */
const metricDesign = {
  referenceRate: 300,
  referenceUnit: 'seeds/m2',
  rowSpacingIn: 8,
  rowsPerStrip: 6,
  stripLengthFt: 100,
  thousandKernelWeightG: 40,
  germinationPct: 95,
  emergencePct: 85,
  rateLevels: [
    { multiplier: 1, label: 'full' },
    { multiplier: 0.5, label: 'half' },
  ],
};

/** The same design as an imperial trial would write it: 15 seeds/ft². */
const imperialDesign = { ...metricDesign, referenceRate: 15, referenceUnit: 'seeds/ft2' };

describe('packetUnits', () => {
  it('turns 8-inch rows into 20.32 cm and 10 seeds per foot into 32.8 per metre', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 in = 2.54 cm and 1 ft = 0.3048 m exactly.
    const metric = packetUnits('metric');
    expect(metric.rowSpacing(8)).toBeCloseTo(20.32, 10);
    expect(metric.perRowLength(10)).toBeCloseTo(10 / 0.3048, 10);
    expect(metric.fromFeet(100)).toBeCloseTo(30.48, 10);
    expect([metric.length, metric.area, metric.rate, metric.weight]).toEqual([
      'm',
      'm²',
      'kg/ha',
      'kg',
    ]);
    const imperial = packetUnits('imperial');
    expect([imperial.length, imperial.area, imperial.rate, imperial.weight]).toEqual([
      'ft',
      'ft²',
      'lb/acre',
      'lb',
    ]);
  });
});

describe('calibrationRows', () => {
  it('works a metric trial in seeds per metre, per 1-m wheel turn, seeds/m² and kg/ha', () => {
    const [half, full] = calibrationRows(metricDesign, 'metric');
    // Hand computation: 8 in = 0.2032 m (Source: NIST SP 811 (2008), Appendix B.8, 1 in =
    // 2.54 cm exactly), so 300 seeds/m² × 0.2032 m = 60.96 seeds per metre of row; a 1-m wheel
    // turn drops 60.96 and 10 turns 609.6. 300 seeds/m² × 40 g per 1,000 = 12 g/m² = 120 kg/ha
    // (10,000 m² per ha, SI definition of the hectare: NIST SP 811, Table 8).
    expect(full!.seedsPerRowLength).toBeCloseTo(60.96, 6);
    expect(full!.seedsPerTurn).toBeCloseTo(60.96, 6);
    expect(full!.seedsPerTenTurns).toBeCloseTo(609.6, 5);
    expect(full!.seedsPerArea).toBeCloseTo(300, 6);
    expect(full!.rate).toBeCloseTo(120, 6);
    expect(half!.label).toBe('half');
    expect(half!.rate).toBeCloseTo(60, 6);
    expect(half!.seedsPerRowLength).toBeCloseTo(30.48, 6);
  });

  it('works an imperial trial in seeds per foot, per 3-ft wheel turn, seeds/ft² and lb/acre', () => {
    const [, full] = calibrationRows(imperialDesign, 'imperial');
    // Hand computation: 15 seeds/ft² × 8/12 ft = 10 seeds per foot of row; a 3-ft wheel turn
    // drops 30 and 10 turns 300. 15 × 43,560 ft² per acre × 0.040 g = 26,136 g = 57.62 lb
    // (Source: NIST Handbook 44 (2023), Appendix C: 1 acre = 43,560 ft², 1 lb = 453.592 37 g).
    expect(full!.seedsPerRowLength).toBeCloseTo(10, 10);
    expect(full!.seedsPerTurn).toBeCloseTo(30, 10);
    expect(full!.seedsPerTenTurns).toBeCloseTo(300, 10);
    expect(full!.seedsPerArea).toBeCloseTo(15, 10);
    expect(full!.rate).toBeCloseTo(26136 / 453.59237, 6);
  });

  it('gives the same seed per metre as per foot for one design, across the two systems', () => {
    const [, metric] = calibrationRows(metricDesign, 'metric');
    const [, imperial] = calibrationRows({ ...metricDesign }, 'imperial');
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft = 0.3048 m exactly.
    expect(imperial!.seedsPerRowLength).toBeCloseTo(metric!.seedsPerRowLength * 0.3048, 8);
    // Source: NIST SP 811 (2008), Appendix B.8 (1 lb = 0.453 592 37 kg, 1 ft = 0.3048 m) and
    // NIST Handbook 44 (2023), Appendix C (1 acre = 43,560 ft²): 1 lb/acre = 0.45359237 kg ÷
    // 0.40468564224 ha = 1.120 851 kg/ha, by hand.
    expect(metric!.rate / imperial!.rate).toBeCloseTo(1.120851, 5);
  });

  it('is empty while the design lacks a seed size', () => {
    expect(calibrationRows({ ...metricDesign, thousandKernelWeightG: null }, 'metric')).toEqual([]);
  });
});

describe('countingNumbers', () => {
  it('counts a metric trial in 1 m of row: each plant is 1 ÷ 0.2032 m² = 4.92 plants/m²', () => {
    const counting = countingNumbers(metricDesign, 'metric');
    // Hand computation: 1 plant in 1 m of 20.32 cm rows stands for 1 ÷ (1 m × 0.2032 m)
    // = 4.921 plants/m² (Source: NIST SP 811 (2008), Appendix B.8, 1 in = 2.54 cm exactly).
    expect(counting.units.countLength).toBe(1);
    expect(counting.areaPerPlantCounted).toBeCloseTo(4.92126, 5);
    const full = counting.rows.find((r) => r.label === 'full')!;
    // 60.96 seeds in 1 m of row; × 95 % germination × 85 % emergence = 49.23 plants.
    expect(full.seedsInCount).toBeCloseTo(60.96, 6);
    expect(full.expectedPlantsInCount).toBeCloseTo(60.96 * 0.95 * 0.85, 6);
  });

  it('counts an imperial trial in 3 ft of row: (count × 4) ÷ row spacing in inches', () => {
    const counting = countingNumbers(imperialDesign, 'imperial');
    // Common practice, no published source: plants/ft² = (count in 3 ft × 4) ÷ spacing (in);
    // at 8-inch rows one plant is 4 ÷ 8 = 0.5 plants/ft².
    expect(counting.units.countLength).toBe(3);
    expect(counting.areaPerPlantCounted).toBeCloseTo(0.5, 10);
    expect(counting.rows.find((r) => r.label === 'full')!.seedsInCount).toBeCloseTo(30, 10);
  });

  it('says nothing about area per plant without a row spacing', () => {
    expect(countingNumbers({ ...metricDesign, rowSpacingIn: null }, 'metric')).toMatchObject({
      areaPerPlantCounted: null,
      rows: [],
    });
  });
});
