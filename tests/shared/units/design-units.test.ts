import { describe, expect, it } from 'vitest';
import {
  LITRES_PER_US_BUSHEL,
  designUnits,
  grainPriceUnit,
} from '../../../shared/units/design-units';

describe('designUnits', () => {
  it('takes row spacing in centimetres for a metric trial and stores inches', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 in = 2.54 cm exactly.
    expect(designUnits('metric').rowSpacing.toStored(20.32)).toBeCloseTo(8, 10);
    expect(designUnits('metric').rowSpacing.fromStored(8)).toBeCloseTo(20.32, 10);
  });

  it('takes strip length in metres for a metric trial and stores feet', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft = 0.3048 m exactly.
    expect(designUnits('metric').stripLength.toStored(30.48)).toBeCloseTo(100, 10);
  });

  it('shows a count per ft² as a count per m² for a metric trial', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft² = 0.092 903 04 m² exactly, so 20 plants
    // per ft² are 20 ÷ 0.092 903 04 = 215.28 per m².
    expect(designUnits('metric').perArea.fromStored(20)).toBeCloseTo(215.278, 3);
    expect(designUnits('metric').perArea.toStored(215.278)).toBeCloseTo(20, 4);
    expect(designUnits('metric').perArea.unit).toBe('m²');
    expect(designUnits('imperial').perArea.fromStored(20)).toBe(20);
  });

  it('counts a seed lot per kg for a metric trial and stores seeds per lb', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 lb = 0.45359237 kg; 31,250 seeds/kg = 14,175/lb.
    expect(designUnits('metric').seedCount.toStored(31_250)).toBeCloseTo(14_174.76, 2);
    expect(designUnits('metric').seedCount.unit).toBe('seeds/kg');
  });

  it('turns a seed price per kg into a price per lb', () => {
    // Source: NIST SP 811 (2008), Appendix B.8: 1 lb = 0.45359237 kg exactly; $2.00/kg = $0.907/lb.
    expect(designUnits('metric').seedPrice.toStored(2)).toBeCloseTo(0.90718474, 8);
  });

  it('reads a US bushel as 35.239 litres', () => {
    // Source: NIST Handbook 44 (2023), Appendix C: 1 US bushel = 2150.42 in³ = 35.239 07 L.
    expect(LITRES_PER_US_BUSHEL).toBeCloseTo(35.23907, 5);
  });

  it('converts a test weight in kg/hL to lb/bu with the usual factor 1.2872', () => {
    // Source: Common practice, no published source: grain trade tables use kg/hL = lb/bu × 1.2872.
    expect(designUnits('metric').bushelWeight.fromStored(60)).toBeCloseTo(60 * 1.2872, 1);
  });

  it('keeps imperial values as they are', () => {
    const units = designUnits('imperial');
    expect(units.rowSpacing.toStored(7.5)).toBe(7.5);
    expect(units.stripLength.unit).toBe('ft');
    expect(units.defaultRateUnit).toBe('lb/acre');
  });

  it('prices grain per tonne for a metric wheat trial', () => {
    // Source: shared/TRADE_FACTS.md §3 (USDA wheat bushel 60 lb) and NIST SP 811 (1 lb =
    // 0.45359237 kg): a bushel is 27.2155 kg, so $272.16 per tonne × 0.0272155 t = $7.407.
    expect(grainPriceUnit('metric', 60).toStored(272.16)).toBeCloseTo(7.407, 3);
    expect(grainPriceUnit('imperial', 60).unit).toBe('$/bu');
  });
});
