import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clientFor, createTestApp, type Client, type TestApp } from '../../helpers/app';

describe('public calculators', () => {
  let t: TestApp;
  let anonymous: Client;

  beforeAll(async () => {
    t = await createTestApp();
    anonymous = clientFor(t.app);
  });
  afterAll(() => t.close());

  describe('POST /api/calc/seeding', () => {
    it('converts 10 seeds per foot of 8-inch rows to 15 seeds/ft² without sign-in', async () => {
      const res = await anonymous.post('/api/calc/seeding', {
        value: 10,
        unit: 'seeds/ft-row',
        rowSpacingIn: 8,
        thousandKernelWeightG: 40,
        wheelCircumferenceFt: 3,
        rowsPerStrip: 6,
        stripLengthFt: 100,
      });
      expect(res.status).toBe(200);
      // Common practice, no published source: 10 seeds/ft × 12 in ÷ 8 in = 15 seeds/ft² (formula as UKY-S, PSU-WS).
      expect(res.body.seedsPerSquareFoot).toBeCloseTo(15, 10);
      // Common practice, no published source: a 3-ft wheel turn at 10 seeds/ft drops 30 seeds.
      expect(res.body.seedsPerWheelTurn).toBeCloseTo(30, 10);
      // 6 rows × 100 ft × 10 seeds/ft × 40 mg = 240 g (derived).
      expect(res.body.perStrip.grams).toBeCloseTo(240, 6);
      expect(res.body.perRow.grams).toBeCloseTo(40, 6);
    });

    it('reproduces the NDSU barley worked example from a target stand', async () => {
      // Source: NDSU Extension, "Optimal seeding rates" (barley) [NDSU-B in TRADE_FACTS]:
      // (1.1 M ÷ 0.85) ÷ (12,500 × 0.95) ≈ 110 lb/ac as printed; exact arithmetic gives 109.0.
      const res = await anonymous.post('/api/calc/seeding', {
        value: 1_100_000,
        unit: 'plants/acre',
        seedsPerLb: 12_500,
        germinationPct: 95,
        emergencePct: 85,
        rowSpacingIn: 7,
      });
      expect(res.status).toBe(200);
      expect(res.body.poundsPerAcre).toBeCloseTo(108.98, 1);
      expect(Math.abs(res.body.poundsPerAcre - 110) / 110).toBeLessThan(0.015);
    });

    it('answers 400 naming thousandKernelWeightG when the seed lot is missing', async () => {
      const res = await anonymous.post('/api/calc/seeding', {
        value: 90,
        unit: 'lb/acre',
        rowSpacingIn: 8,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.thousandKernelWeightG).toMatch(
        /thousand-kernel weight or seeds per lb/,
      );
    });

    it('answers 400 naming value for a negative rate and unit for an unknown unit', async () => {
      const res = await anonymous.post('/api/calc/seeding', {
        value: -1,
        unit: 'bushels',
        rowSpacingIn: 8,
        thousandKernelWeightG: 40,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.value).toBeDefined();
      expect(res.body.error.fields.unit).toBeDefined();
    });
  });

  describe('POST /api/calc/calibration', () => {
    it('reports 80 seeds against a 30-seed target per 3-ft turn as 267 % with advice to close cups', async () => {
      const res = await anonymous.post('/api/calc/calibration', {
        seedsCounted: 80,
        wheelTurns: 1,
        wheelCircumferenceFt: 3,
        rowSpacingIn: 8,
        targetSeedsPerFootOfRow: 10,
      });
      expect(res.status).toBe(200);
      // Common practice, no published source: 80 ÷ 30 = 267 % of target.
      expect(Math.round(res.body.percentOfTarget)).toBe(267);
      expect(res.body.targetSeedsPerTurn).toBe(30);
      expect(res.body.deliveredSeedsPerFootOfRow).toBeCloseTo(26.667, 3);
      expect(res.body.advice).toMatch(/close about/i);
    });

    it('says to cover about half the cups when the delivery is about double', async () => {
      const res = await anonymous.post('/api/calc/calibration', {
        seedsCounted: 300,
        wheelTurns: 5,
        wheelCircumferenceFt: 3,
        rowSpacingIn: 8,
        targetSeedsPerFootOfRow: 10,
      });
      expect(Math.round(res.body.percentOfTarget)).toBe(200);
      expect(res.body.targetSeedsForRun).toBe(150);
      expect(res.body.advice).toMatch(/half the cups/i);
    });

    it('answers 400 naming wheelTurns for zero turns', async () => {
      const res = await anonymous.post('/api/calc/calibration', {
        seedsCounted: 10,
        wheelTurns: 0,
        wheelCircumferenceFt: 3,
        rowSpacingIn: 8,
        targetSeedsPerFootOfRow: 10,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.wheelTurns).toBeDefined();
    });
  });
});
