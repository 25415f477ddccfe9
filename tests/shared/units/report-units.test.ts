import { describe, expect, it } from 'vitest';
import { pricesInWords, reportDisplayUnits } from '../../../shared/units/report-units';

describe('reportDisplayUnits', () => {
  it('shows a metric wheat report per m², per kg of seed and per tonne of grain', () => {
    const display = reportDisplayUnits({
      yield: 't/ha',
      seed: 'kg/ha',
      money: '$/ha',
      system: 'metric',
      bushelPounds: 60,
    });
    expect([display.perArea.unit, display.seedPrice.unit, display.grainPrice.unit]).toEqual([
      'm²',
      '$/kg',
      '$/t',
    ]);
    expect(display.landArea).toBe('hectare');
    // Source: NIST SP 811 (2008), Appendix B.8: 1 lb = 0.453 592 37 kg, so $0.50/lb = $1.1023/kg;
    // with the USDA 60-lb wheat bushel (shared/TRADE_FACTS.md §3) $8.00/bu = $293.95/t.
    expect(pricesInWords({ seedPricePerLb: 0.5, grainPricePerBu: 8 }, display)).toBe(
      'seed $1.10/kg, grain $293.95/t',
    );
  });

  it('takes a custom crop’s bushel weight from the report', () => {
    const display = reportDisplayUnits(
      { yield: 'kg/ha', seed: 'kg/ha', money: '$/ha', system: 'metric', bushelPounds: 50 },
      'custom',
    );
    // Source: NIST SP 811 (2008): a 50-lb bushel is 22.680 kg; $5.00/bu = $220.46/t.
    expect(display.grainPrice.fromStored(5)).toBeCloseTo(220.462, 3);
  });

  it('leaves an imperial report per ft², lb and bushel', () => {
    const display = reportDisplayUnits(
      { yield: 'bu/acre', seed: 'lb/acre', money: '$/acre' },
      'wheat',
    );
    expect(display.landArea).toBe('acre');
    expect(pricesInWords({ seedPricePerLb: 0.5, grainPricePerBu: null }, display)).toBe(
      'seed $0.50/lb, grain –/bu',
    );
  });
});
