// The trial export names each column's unit in the trial's unit system: a metric trial's derived
// columns are per m², seed in kg/ha, yield in t/ha, m² and $ per hectare, with no imperial column left.
import { describe, expect, it } from 'vitest';
import { stripsCsv } from '../../../api/reports/reports.csv';
import type { DerivedStrip, SiteRow, TrialFacts } from '../../../api/reports/reports.presenter';

const SITE = '00000000-0000-4000-8000-000000000010';

const trial = (unitSystem: 'imperial' | 'metric'): TrialFacts => ({
  id: '00000000-0000-4000-8000-000000000001',
  name: 'Invented export',
  question: '',
  crop: 'wheat',
  customCrop: null,
  season: '2027',
  unitSystem,
  referenceRate: 120,
  referenceUnit: 'lb/acre',
  blocksPerSite: 1,
  rowSpacingIn: 7.5,
  thousandKernelWeightG: 38,
  seedPricePerLb: 0.3,
  grainPricePerBu: 7,
});

const site = { id: SITE, fieldName: 'North', growerName: null, soil: '', previousCrop: '' };

const strip: DerivedStrip = {
  strip: { id: 's1', siteId: SITE, block: 1, position: 1, rateLevelId: 'l1', observation: null },
  rate: '1',
  label: 'full',
  yield: null,
  derived: {
    targetSeedsPerSquareFoot: 30,
    plantsPerSquareFoot: 20,
    plantsPerSquareMetre: 215.278,
    establishmentPercent: 66.7,
    tillersPerPlant: 2,
    headsPerSquareFoot: 50,
    headsPerSquareMetre: 538.196,
    headsPerPlant: 2.5,
    harvestedAreaSquareFeet: 100,
    yieldBushelsPerAcre: 60,
    yieldKilogramsPerHectare: 4035.3,
    seedPoundsPerAcre: 120,
    seedReturn: 30,
    returnOverSeedCostPerAcre: 384,
  },
};

function parse(csv: string) {
  const [head, row] = csv.trim().split('\r\n');
  const names = head!.split(',');
  const cells = row!.split(',');
  return Object.fromEntries(names.map((n, i) => [n, cells[i]]));
}

describe('stripsCsv units', () => {
  it('writes a metric trial’s derived columns per m², kg/ha of seed, t/ha of grain and hectare', () => {
    const row = parse(stripsCsv(trial('metric'), [site as SiteRow], [strip]));
    const headers = Object.keys(row);
    expect(headers.filter((h) => /foot|feet|acre|_ft|_lb|pounds|bushel/.test(h))).toEqual([]);
    expect(headers).toEqual(
      expect.arrayContaining(['grain_weight_kg', 'stand_row_length_m', 'test_weight_kg_hl']),
    );
    // Source: NIST SP 811 (2008), Appendix B.8: 1 ft² = 0.092 903 04 m², 1 lb = 0.453 592 37 kg,
    // 1 acre = 0.404 685 6 ha. 30 seeds/ft² = 322.9/m²; 120 lb/acre = 134.5 kg/ha;
    // 100 ft² = 9.29 m²; $384/acre = $948.9/ha.
    expect(Number(row.target_seeds_per_square_metre)).toBeCloseTo(322.917, 2);
    expect(Number(row.seed_kilograms_per_hectare)).toBeCloseTo(134.502, 2);
    expect(Number(row.harvested_area_square_metres)).toBeCloseTo(9.2903, 3);
    expect(Number(row.return_over_seed_cost_per_hectare)).toBeCloseTo(948.88, 1);
    // Source: NIST SP 811 (2008), Appendix B.8 / SI: 1 t = 1000 kg, so 4,035.3 kg/ha = 4.0353 t/ha.
    expect(Number(row.yield_tonnes_per_hectare)).toBeCloseTo(4.0353, 4);
    expect(headers.filter((h) => h.startsWith('yield_'))).toEqual(['yield_tonnes_per_hectare']);
  });

  it('keeps an imperial trial’s columns per ft², lb/acre and acre', () => {
    const row = parse(stripsCsv(trial('imperial'), [site as SiteRow], [strip]));
    expect(row.seed_pounds_per_acre).toBe('120');
    expect(row.return_over_seed_cost_per_acre).toBe('384');
    expect(Object.keys(row)).toContain('test_weight_lb_bu');
  });
});
