// Builders for the collect component tests: an invented site with strips in blocks, in the
// order the API may send them (not field order).
import { EMPTY_OBSERVATION } from '../../shared/schemas/observation';
import type { SiteStrips, StripDto } from '../../shared/schemas/strip';
import type { UnitSystem } from '../../shared/schemas/trial';

const SITE = '55555555-5555-4555-8555-555555555555';

function buildStrip(block: number, position: number, rate: number): StripDto {
  return {
    stripId: `66666666-6666-4666-8666-6666666${block}${position}000`.slice(0, 36),
    siteId: SITE,
    block,
    position,
    plotNumber: block * 100 + position,
    rateLevelId: `77777777-7777-4777-8777-77777777777${rate === 1 ? 1 : 2}`,
    rate,
    label: rate === 1 ? 'full' : 'half',
    version: 1,
    values: { ...EMPTY_OBSERVATION },
    derived: {
      targetSeedsPerSquareFoot: null,
      plantsPerSquareFoot: null,
      plantsPerSquareMetre: null,
      establishmentPercent: null,
      tillersPerPlant: null,
      headsPerSquareFoot: null,
      headsPerSquareMetre: null,
      headsPerPlant: null,
      harvestedAreaSquareFeet: null,
      yieldBushelsPerAcre: null,
      yieldKilogramsPerHectare: null,
      seedPoundsPerAcre: null,
      seedReturn: null,
      returnOverSeedCostPerAcre: null,
    },
    warnings: [],
    recorded: { stand: false, tillers: false, heads: false, yield: false },
    updatedAt: null,
  };
}

/** Two blocks of two strips (plots 101, 102, 201, 202), listed block 2 first. */
export function buildSiteStrips(unitSystem: UnitSystem = 'metric'): SiteStrips {
  return {
    site: {
      siteId: SITE,
      trialId: '88888888-8888-4888-8888-888888888888',
      trialName: 'Invented oat trial',
      fieldName: 'Invented field',
      growerName: 'Invented Grower',
      notes: '',
      unitSystem,
      crop: 'oats',
      cropName: 'Oats',
      standardMoisturePercent: 13.5,
      bushelPounds: 32,
      rateLevels: [],
      blocksPerSite: 2,
      rowsPerStrip: 6,
      rowSpacingIn: 8,
      stripLengthFt: 100,
      thousandKernelWeightG: 32,
      referenceRate: 96,
      referenceUnit: 'lb/acre',
      seedPricePerLb: 0.9,
      grainPricePerBu: 4,
      publishedAt: null,
      dataVersion: 1,
      canEdit: true,
      isCoordinator: false,
      sowingDate: null,
      emergenceDate: null,
      headingDate: null,
      harvestDate: null,
    },
    strips: [
      buildStrip(2, 2, 1),
      buildStrip(2, 1, 0.5),
      buildStrip(1, 2, 0.5),
      buildStrip(1, 1, 1),
    ],
  };
}
