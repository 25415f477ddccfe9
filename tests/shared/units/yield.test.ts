import { describe, expect, it } from 'vitest';
import {
  ACRES_PER_HECTARE,
  GRAMS_PER_POUND,
  KG_PER_HA_PER_LB_PER_ACRE,
  SQUARE_FEET_PER_ACRE,
} from '../../../shared/units/constants';
import { CROPS, kilogramsPerHectarePerBushelPerAcre } from '../../../shared/units/crops';
import {
  countPerArea,
  establishmentPercent,
  seedReturn,
  stripYield,
  weightAtStandardMoisture,
} from '../../../shared/units/yield';

describe('unit constants and crops', () => {
  it('uses the exact pound and acre', () => {
    // Source: international pound (1959) and US survey acre, TRADE_FACTS USU/AH697
    expect(GRAMS_PER_POUND).toBe(453.59237);
    expect(SQUARE_FEET_PER_ACRE).toBe(43_560);
    // Source: USU: 1 ha = 2.471 ac; 1 lb/ac = 1.12 kg/ha
    expect(ACRES_PER_HECTARE).toBeCloseTo(2.471, 3);
    expect(KG_PER_HA_PER_LB_PER_ACRE).toBeCloseTo(1.12, 2);
  });

  it('holds the USDA bushel weights and moisture bases', () => {
    // Source: Ohio State AGF-503 and Missouri G4020 (TRADE_FACTS OSU-503; UNC-MO)
    expect(CROPS.wheat.bushelPounds).toBe(60);
    expect(CROPS.rye.bushelPounds).toBe(56);
    expect(CROPS.barley.bushelPounds).toBe(48);
    expect(CROPS.oats.bushelPounds).toBe(32);
    // Source: UW-Extension (TRADE_FACTS UW-R)
    expect(CROPS.wheat.standardMoisturePercent).toBe(13.5);
    expect(CROPS.barley.standardMoisturePercent).toBe(14.5);
    expect(CROPS.oats.standardMoisturePercent).toBe(14);
  });

  it('converts bu/ac to kg/ha with the NDSU factors', () => {
    // Source: NDSU metric conversion card (TRADE_FACTS NDSU-MC): 67.25, 62.77, 53.80, 35.87
    expect(kilogramsPerHectarePerBushelPerAcre('wheat')).toBeCloseTo(67.25, 2);
    expect(kilogramsPerHectarePerBushelPerAcre('rye')).toBeCloseTo(62.77, 2);
    expect(kilogramsPerHectarePerBushelPerAcre('barley')).toBeCloseTo(53.8, 2);
    expect(kilogramsPerHectarePerBushelPerAcre('oats')).toBeCloseTo(35.87, 2);
  });
});

describe('yield and counts', () => {
  it('adjusts to standard moisture by dry matter, not by subtracting water', () => {
    // Source: UF/IFAS EDIS AG442 formula; by hand: 1000 × (100 − 18) ÷ (100 − 13.5) = 947.9769
    expect(weightAtStandardMoisture(1000, 18, 13.5)).toBeCloseTo(947.9769, 4);
    expect(weightAtStandardMoisture(1000, 18, 13.5)).not.toBeCloseTo(1000 - (18 - 13.5) * 10, 0);
  });

  it('gives bu/ac and kg/ha for a threshed strip', () => {
    // By hand: 20 kg at 13.5 % on 600 ft² → 20000/453.59237 lb × 43560/600 = 3201.1 lb/ac ÷ 60 = 53.35 bu/ac
    const result = stripYield({
      grainGrams: 20_000,
      areaSquareFeet: 600,
      moisturePercent: 13.5,
      crop: 'wheat',
    });
    expect(result.bushelsPerAcre).toBeCloseTo(53.35, 2);
    expect(result.kilogramsPerHectare).toBeCloseTo(result.bushelsPerAcre * 67.25, 0);
    expect(result.warning).toBeUndefined();
    expect(
      stripYield({ grainGrams: 200_000, areaSquareFeet: 600, moisturePercent: 13.5, crop: 'wheat' })
        .warning,
    ).toMatch(/outside the usual/);
  });

  it('counts plants per ft² on measured row lengths', () => {
    // Source: Penn State wheat stand assessment (PSU-WS): plants/ft² = count in 3 ft × 4 ÷ row width (in)
    const result = countPerArea({ counts: [45], rowLengthFeet: 3, rowSpacingInches: 7.5 });
    expect(result.perSquareFoot).toBeCloseTo((45 * 4) / 7.5, 10);
    expect(result.perSquareMetre).toBeCloseTo(result.perSquareFoot * 10.7639, 3);
    expect(establishmentPercent(18, 24)).toBe(75);
    expect(seedReturn(3600, 120)).toBe(30);
  });
});
