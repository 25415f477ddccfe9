// Builds the site and pooled report bodies from loaded rows: derives each strip's yield,
// runs the analysis engine and writes the findings. No database access here.
import {
  addMixedModel,
  analyzeSite,
  chooseReferenceRate,
  combineSites,
  sortRateLevels,
  type Prices,
  type SiteAnalysis,
  type SiteStrip,
} from '../../shared/analysis/index';
import {
  pooledFindings,
  pooledStatisticianNotes,
  siteFindings,
  siteStatisticianNotes,
} from '../../shared/reports/findings';
import { notEnoughDataSentence } from '../../shared/reports/plain-words';
import type {
  ComponentRow,
  EconomicsRow,
  PooledQuery,
  PooledReport,
  PooledSite,
  ReportPhoto,
  ReportRate,
  ReportStrip,
  ReportUnits,
  SiteReport,
} from '../../shared/schemas/report';
import type { Trial } from '../../db/entities/trial.entity';
import type { DerivedValues, ObservationValues } from '../../shared/schemas/observation';
import type { CropKey, CustomCrop, RateUnit, UnitSystem } from '../../shared/schemas/trial';
import {
  ACRES_PER_HECTARE,
  GRAMS_PER_POUND,
  KG_PER_HA_PER_LB_PER_ACRE,
  KILOGRAMS_PER_TONNE,
} from '../../shared/units/constants';
import { plotNumber } from '../../shared/units/plot-number';
import { reportDisplayUnits } from '../../shared/units/report-units';
import { cropFacts, deriveStripValues, type StripContext } from '../../shared/units/strip-derived';

/** Trial facts the reports need, as loaded from the trials row. */
export interface TrialFacts {
  id: string;
  name: string;
  question: string;
  crop: CropKey | null;
  customCrop: CustomCrop | null;
  season: string | null;
  unitSystem: UnitSystem;
  referenceRate: number | null;
  referenceUnit: RateUnit | null;
  blocksPerSite: number | null;
  rowSpacingIn: number | null;
  thousandKernelWeightG: number | null;
  seedPricePerLb: number | null;
  grainPricePerBu: number | null;
}

/** A trials row's facts for the reports (the site and pooled reports and the series share it). */
export function trialFactsOf(trial: Trial): TrialFacts {
  return {
    id: trial.id,
    name: trial.name,
    question: trial.question ?? '',
    crop: trial.crop,
    customCrop: trial.customCrop,
    season: trial.season,
    unitSystem: trial.unitSystem ?? 'imperial',
    referenceRate: trial.referenceRate,
    referenceUnit: trial.referenceUnit,
    blocksPerSite: trial.blocksPerSite,
    rowSpacingIn: trial.rowSpacingIn,
    thousandKernelWeightG: trial.thousandKernelWeightG,
    seedPricePerLb: trial.seedPricePerLb,
    grainPricePerBu: trial.grainPricePerBu,
  };
}

export interface LevelRow {
  id: string;
  position: number;
  multiplier: number;
  label: string;
}

export interface SiteRow {
  id: string;
  trialId: string;
  fieldName: string;
  growerName: string | null;
  soil: string;
  previousCrop: string;
  fertility: string;
  notes: string;
  sowingDate: string | null;
  emergenceDate: string | null;
  headingDate: string | null;
  harvestDate: string | null;
  published: boolean;
  dataVersion: number;
}

export interface StripRow {
  id: string;
  siteId: string;
  block: number;
  position: number;
  rateLevelId: string;
  observation: ObservationValues | null;
}

/** Everything derived for one strip. */
export interface DerivedStrip {
  strip: StripRow;
  rate: string;
  label: string;
  derived: DerivedValues | null;
  yield: number | null;
}

/** The rate key the analysis uses: the multiplier as a string ("0.5"). */
export const rateKey = (multiplier: number) => String(Number(multiplier));

/** A metric trial's yield unit: tonnes per hectare, as metric growers quote grain yield. */
export const METRIC_YIELD_UNIT = 't/ha';
/** The metric yield unit of pooled inputs published before yields were given in t/ha. */
const OLD_METRIC_YIELD_UNIT = 'kg/ha';

/**
 * The report's units. `yieldUnit` names the unit stored yields are in when they were frozen in a
 * published snapshot before metric yields became t/ha (kg/ha); live reports leave it out.
 */
export function unitsOf(trial: TrialFacts, yieldUnit?: string): ReportUnits {
  const common = {
    system: trial.unitSystem,
    bushelPounds: cropFacts(trial.crop, trial.customCrop)?.bushelPounds ?? null,
  };
  return trial.unitSystem === 'metric'
    ? { yield: yieldUnit ?? METRIC_YIELD_UNIT, seed: 'kg/ha', money: '$/ha', ...common }
    : { yield: yieldUnit ?? 'bu/acre', seed: 'lb/acre', money: '$/acre', ...common };
}

function contextFor(
  trial: TrialFacts,
  multiplier: number,
  prices: { seed: number | null; grain: number | null },
): StripContext {
  return {
    unitSystem: trial.unitSystem,
    crop: cropFacts(trial.crop, trial.customCrop),
    rowSpacingIn: trial.rowSpacingIn,
    thousandKernelWeightG: trial.thousandKernelWeightG,
    referenceRate: trial.referenceRate,
    referenceUnit: trial.referenceUnit,
    multiplier,
    seedPricePerLb: prices.seed,
    grainPricePerBu: prices.grain,
  };
}

const EMPTY: ObservationValues = {
  seedsSown: null,
  standCounts: [],
  standRowLength: null,
  tillerPlants: null,
  tillerCount: null,
  headCounts: [],
  headRowLength: null,
  grainWeight: null,
  harvestRows: null,
  harvestLength: null,
  harvestArea: null,
  moisturePct: null,
  testWeight: null,
  sowingDate: null,
  emergenceDate: null,
  headingDate: null,
  harvestDate: null,
  notes: '',
};

/** The trial's rate levels in report form, with the seed sown per unit area when known. */
export function reportRates(trial: TrialFacts, levels: readonly LevelRow[]): ReportRate[] {
  const ordered = [...levels].sort((a, b) => a.multiplier - b.multiplier);
  return ordered.map((level) => {
    let seedRate: number | null = null;
    try {
      const pounds = deriveStripValues(
        EMPTY,
        contextFor(trial, level.multiplier, { seed: null, grain: null }),
      ).seedPoundsPerAcre;
      if (pounds !== null)
        seedRate = trial.unitSystem === 'metric' ? pounds * KG_PER_HA_PER_LB_PER_ACRE : pounds;
    } catch {
      seedRate = null;
    }
    return {
      key: rateKey(level.multiplier),
      label: level.label,
      multiplier: level.multiplier,
      seedRate,
    };
  });
}

/** Derives every strip's values; yield in the trial's unit (bu/acre or t/ha). */
export function deriveStrips(
  trial: TrialFacts,
  levels: readonly LevelRow[],
  strips: readonly StripRow[],
  prices: { seed: number | null; grain: number | null } = {
    seed: trial.seedPricePerLb,
    grain: trial.grainPricePerBu,
  },
): DerivedStrip[] {
  const byId = new Map(levels.map((level) => [level.id, level]));
  return strips.map((strip) => {
    const level = byId.get(strip.rateLevelId);
    const multiplier = level?.multiplier ?? Number.NaN;
    const derived = strip.observation
      ? deriveStripValues(strip.observation, contextFor(trial, multiplier, prices))
      : null;
    const value = derived
      ? trial.unitSystem === 'metric'
        ? derived.yieldKilogramsPerHectare === null
          ? null
          : derived.yieldKilogramsPerHectare / KILOGRAMS_PER_TONNE
        : derived.yieldBushelsPerAcre
      : null;
    return { strip, rate: rateKey(multiplier), label: level?.label ?? '?', derived, yield: value };
  });
}

const mean = (values: readonly (number | null | undefined)[]): number | null => {
  const present = values.filter(
    (v): v is number => v !== null && v !== undefined && Number.isFinite(v),
  );
  return present.length === 0 ? null : present.reduce((a, b) => a + b, 0) / present.length;
};

/** Returns per area in the trial's money unit ($/acre, or $/ha for metric trials). */
const perArea = (trial: TrialFacts, perAcre: number | null) =>
  perAcre === null ? null : trial.unitSystem === 'metric' ? perAcre * ACRES_PER_HECTARE : perAcre;

export function componentRows(
  trial: TrialFacts,
  rates: readonly ReportRate[],
  strips: readonly DerivedStrip[],
): ComponentRow[] {
  return rates.map((rate) => {
    const mine = strips.filter((s) => s.rate === rate.key);
    const pick = (key: keyof DerivedValues) => mean(mine.map((s) => s.derived?.[key] ?? null));
    return {
      rate: rate.key,
      label: rate.label,
      strips: mine.filter((s) => s.yield !== null).length,
      seedRate: rate.seedRate,
      plantsPerSquareFoot: pick('plantsPerSquareFoot'),
      establishmentPercent: pick('establishmentPercent'),
      tillersPerPlant: pick('tillersPerPlant'),
      headsPerSquareFoot: pick('headsPerSquareFoot'),
      headsPerPlant: pick('headsPerPlant'),
      yield: mean(mine.map((s) => s.yield)),
      seedReturn: pick('seedReturn'),
      returnOverSeedCost: perArea(trial, pick('returnOverSeedCostPerAcre')),
    };
  });
}

function firstDate(
  site: SiteRow,
  strips: readonly StripRow[],
  key: 'sowingDate' | 'emergenceDate' | 'headingDate' | 'harvestDate',
): string | null {
  if (site[key]) return site[key];
  const dates = strips
    .map((s) => s.observation?.[key] ?? null)
    .filter((d): d is string => !!d)
    .sort();
  return dates[0] ?? null;
}

/** Runs the site analysis; returns the engine's message when the data cannot be analysed yet. */
function analyseSite(
  name: string,
  derived: readonly DerivedStrip[],
  reference: string,
): { analysis: SiteAnalysis | null; error: string | null } {
  if (derived.length === 0)
    return { analysis: null, error: 'The site has no strips yet: randomize it first.' };
  if (derived.every((s) => s.yield === null))
    return { analysis: null, error: 'No yields have been entered for this site yet.' };
  const rows: SiteStrip[] = derived.map((s) => ({
    block: String(s.strip.block),
    rate: s.rate,
    value: s.yield,
  }));
  try {
    return {
      analysis: { site: name, ...analyzeSite(rows, { reference, manyToOne: true }) },
      error: null,
    };
  } catch (error) {
    return {
      analysis: null,
      error: `Not enough yield data to analyse yet (${(error as Error).message.replace(/^analyzeSite:?\s*/, '')}).`,
    };
  }
}

export function referenceOf(rates: readonly ReportRate[]): string {
  const keys = sortRateLevels(rates.map((r) => r.key));
  return chooseReferenceRate(
    keys,
    keys.map(() => 1),
  );
}

const cropNameOf = (trial: TrialFacts) => cropFacts(trial.crop, trial.customCrop)?.name ?? null;

/** The live site report body (without the publishing fields). */
export function buildSiteReport(input: {
  trial: TrialFacts;
  levels: readonly LevelRow[];
  site: SiteRow;
  strips: readonly StripRow[];
  photos: readonly ReportPhoto[];
}): Omit<SiteReport, 'published' | 'dataChangedSincePublished' | 'fromSnapshot' | 'canPublish'> {
  const { trial, site } = input;
  const rates = reportRates(trial, input.levels);
  const reference = referenceOf(rates);
  const units = unitsOf(trial);
  const derived = deriveStrips(trial, input.levels, input.strips);
  const { analysis, error } = analyseSite(site.fieldName, derived, reference);
  const components = componentRows(trial, rates, derived);
  const labels = Object.fromEntries(rates.map((r) => [r.key, r.label]));
  const withYield = derived.filter((s) => s.yield !== null).length;
  const blocks = new Set(input.strips.map((s) => s.block)).size || trial.blocksPerSite || 0;
  const findingsInput = analysis
    ? {
        analysis,
        rateLabels: labels,
        yieldUnit: units.yield,
        returns: components,
        prices: { seedPricePerLb: trial.seedPricePerLb, grainPricePerBu: trial.grainPricePerBu },
        moneyUnit: units.money,
        priceUnits: reportDisplayUnits(units),
      }
    : null;
  const findings = findingsInput
    ? siteFindings(findingsInput)
    : withYield > 0 && withYield < derived.length
      ? [notEnoughDataSentence({ withYield, strips: derived.length })]
      : [error ?? 'This site cannot be analysed yet.'];
  const forStatistician = findingsInput ? siteStatisticianNotes(findingsInput) : [];
  const strips: ReportStrip[] = derived.map((s) => ({
    id: s.strip.id,
    block: s.strip.block,
    position: s.strip.position,
    plotNumber: plotNumber(s.strip.block, s.strip.position),
    rate: s.rate,
    label: s.label,
    yield: s.yield,
    plantsPerSquareFoot: s.derived?.plantsPerSquareFoot ?? null,
    tillersPerPlant: s.derived?.tillersPerPlant ?? null,
    headsPerSquareFoot: s.derived?.headsPerSquareFoot ?? null,
    notes: s.strip.observation?.notes ?? '',
  }));
  return {
    site: {
      id: site.id,
      trialId: trial.id,
      trialName: trial.name,
      question: trial.question,
      fieldName: site.fieldName,
      growerName: site.growerName,
      crop: trial.crop,
      cropName: cropNameOf(trial),
      season: trial.season,
      soil: site.soil,
      previousCrop: site.previousCrop,
      fertility: site.fertility,
      notes: site.notes,
      dates: {
        sowing: firstDate(site, input.strips, 'sowingDate'),
        emergence: firstDate(site, input.strips, 'emergenceDate'),
        heading: firstDate(site, input.strips, 'headingDate'),
        harvest: firstDate(site, input.strips, 'harvestDate'),
      },
      design: { rates, blocks, reference },
      completeness: {
        strips: derived.length,
        withYield,
        missing: derived.length - withYield,
        percent: derived.length === 0 ? 0 : (100 * withYield) / derived.length,
      },
      units,
      dataVersion: site.dataVersion,
    },
    analysis: analysis as SiteReport['analysis'],
    analysisError: error,
    components: {
      byRate: components,
      prices: { seedPricePerLb: trial.seedPricePerLb, grainPricePerBu: trial.grainPricePerBu },
    },
    strips,
    findings,
    forStatistician,
    photos: [...input.photos],
  };
}

/**
 * The frozen input of a pooled report: enough to re-run filters and prices on a published
 * snapshot without reading live data.
 */
export interface PooledInput {
  trial: TrialFacts;
  /**
   * The unit of the frozen yields (bu/acre or t/ha). Absent in snapshots published before it was
   * stored: their metric yields are in kg/ha, and re-running them keeps that unit.
   */
  yieldUnit?: string;
  rates: ReportRate[];
  sites: (PooledSite & { yields: { block: number; rate: string; value: number | null }[] })[];
}

/** Reduces loaded rows to the pooled input (yields per strip, site facts). */
export function pooledInput(
  trial: TrialFacts,
  levels: readonly LevelRow[],
  sites: readonly SiteRow[],
  strips: readonly StripRow[],
): PooledInput {
  const derived = deriveStrips(trial, levels, strips);
  const bySite = new Map<string, DerivedStrip[]>();
  for (const strip of derived) {
    const list = bySite.get(strip.strip.siteId) ?? [];
    list.push(strip);
    bySite.set(strip.strip.siteId, list);
  }
  return {
    trial,
    yieldUnit: unitsOf(trial).yield,
    rates: reportRates(trial, levels),
    sites: sites.map((site) => {
      const mine = bySite.get(site.id) ?? [];
      return {
        id: site.id,
        fieldName: site.fieldName,
        soil: site.soil,
        previousCrop: site.previousCrop,
        published: site.published,
        strips: mine.length,
        stripsWithYield: mine.filter((s) => s.yield !== null).length,
        yields: mine.map((s) => ({ block: s.strip.block, rate: s.rate, value: s.yield })),
      };
    }),
  };
}

/** A site needs yield on at least this share of its strips to join the pooled analysis. */
const MIN_COMPLETE_SHARE = 0.75;

const same = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

/** Engine prices in the trial's units: seed per rate unit, grain per yield unit. */
function enginePrices(
  trial: TrialFacts,
  units: ReportUnits,
  seed: number | null,
  grain: number | null,
): Prices | undefined {
  if (seed === null || !grain || !(grain > 0)) return undefined;
  if (trial.unitSystem === 'metric') {
    const bushelKg =
      ((cropFacts(trial.crop, trial.customCrop)?.bushelPounds ?? 60) * GRAMS_PER_POUND) / 1000;
    // $ per kg/ha of seed over one hectare is $ per kg; grain in t/ha is worth $ per tonne (per kg
    // in a snapshot frozen in kg/ha), so either way price × yield is $ per hectare.
    const kilogramsPerYieldUnit = units.yield === OLD_METRIC_YIELD_UNIT ? 1 : KILOGRAMS_PER_TONNE;
    return {
      seedPricePerRateUnit: (seed * 1000) / GRAMS_PER_POUND,
      grainPricePerYieldUnit: (grain / bushelKg) * kilogramsPerYieldUnit,
      rateUnit: units.seed,
      yieldUnit: units.yield,
    };
  }
  return {
    seedPricePerRateUnit: seed,
    grainPricePerYieldUnit: grain,
    rateUnit: units.seed,
    yieldUnit: units.yield,
  };
}

/** The pooled report body (without publishing fields), from the pooled input and the reader's filters and prices. */
export function buildPooledReport(
  input: PooledInput,
  query: PooledQuery,
): Omit<
  PooledReport,
  'published' | 'dataChangedSincePublished' | 'fromSnapshot' | 'canPublish' | 'publicLinkToken'
> {
  const { trial, rates } = input;
  const units = unitsOf(
    trial,
    input.yieldUnit ?? (trial.unitSystem === 'metric' ? OLD_METRIC_YIELD_UNIT : undefined),
  );
  const reference = referenceOf(rates);
  const labels = Object.fromEntries(rates.map((r) => [r.key, r.label]));
  const seedPrice = query.seedPrice ?? trial.seedPricePerLb;
  const grainPrice = query.grainPrice ?? trial.grainPricePerBu;
  const prices = enginePrices(trial, units, seedPrice, grainPrice);
  const seedRates = new Map(rates.map((r) => [r.key, r.seedRate]));

  const included: { site: PooledSite; name: string; analysis: SiteAnalysis; rows: SiteStrip[] }[] =
    [];
  const excluded: { site: PooledSite; reason: string }[] = [];
  const names = new Map<string, number>();
  for (const { yields, ...site } of input.sites) {
    const reason = exclusionReason(site, trial, query);
    if (reason) {
      excluded.push({ site, reason });
      continue;
    }
    const rows: SiteStrip[] = yields.map((y) => ({
      block: String(y.block),
      rate: y.rate,
      value: y.value,
    }));
    try {
      const count = (names.get(site.fieldName) ?? 0) + 1;
      names.set(site.fieldName, count);
      const name = count === 1 ? site.fieldName : `${site.fieldName} (${count})`;
      included.push({ site, name, analysis: analyzeSite(rows, { reference }), rows });
    } catch (error) {
      excluded.push({
        site,
        reason: `cannot be analysed yet (${(error as Error).message.replace(/^analyzeSite:?\s*/, '')})`,
      });
    }
  }

  const rateKeys = sortRateLevels(rates.map((r) => r.key));
  const numeric = Object.fromEntries(rates.map((r) => [r.key, r.seedRate ?? r.multiplier]));
  const seedUnit = rates.every((r) => r.seedRate !== null) ? units.seed : '× reference';
  let analysis: PooledReport['analysis'] = null;
  let analysisError: string | null = null;
  if (included.length < 2) {
    analysisError = `The pooled analysis needs at least two sites with complete yields (${included.length === 1 ? 'one site is' : `${included.length} sites are`} ready).`;
  } else {
    try {
      analysis = combineSites(
        included.map(({ name, analysis: a }) => ({ site: name, analysis: a })),
        rateKeys,
        { reference, ratesNumeric: numeric, prices },
      );
      // The mixed model uses every strip of the included sites (see shared/analysis).
      addMixedModel(
        analysis,
        included.flatMap(({ name, rows }) => rows.map((row) => ({ site: name, ...row }))),
        rateKeys,
        reference,
      );
    } catch (error) {
      analysisError = `The pooled analysis could not be run: ${(error as Error).message}`;
    }
  }

  const idByName = new Map(included.map((entry) => [entry.name, entry.site.id]));
  const lsdByName = new Map(included.map((entry) => [entry.name, entry.analysis.lsd]));
  const siteDifferences = (analysis?.siteDifferences ?? []).map((d) => ({
    ...d,
    siteId: idByName.get(d.site) ?? '',
    lsd: lsdByName.get(d.site) ?? Number.NaN,
  }));
  const siteMeans = included.flatMap(({ name, analysis: a }) =>
    a.means.map((m) => ({
      site: name,
      rate: m.rate,
      seedRate: seedRates.get(m.rate) ?? null,
      mean: m.mean,
    })),
  );

  const economics: EconomicsRow[] = analysis
    ? (() => {
        const rows = analysis.means.map((m) => {
          const seedRate = seedRates.get(m.rate) ?? null;
          const seedCost =
            prices && seedRate !== null ? seedRate * prices.seedPricePerRateUnit : null;
          const grainValue = prices ? m.mean * prices.grainPricePerYieldUnit : null;
          return {
            rate: m.rate,
            label: labels[m.rate] ?? m.rate,
            seedRate,
            seedCost,
            meanYield: m.mean,
            grainValue,
            returnOverSeedCost:
              grainValue !== null && seedCost !== null ? grainValue - seedCost : null,
            versusReference: null as number | null,
          };
        });
        const referenceReturn = rows.find((r) => r.rate === reference)?.returnOverSeedCost ?? null;
        for (const row of rows)
          row.versusReference =
            row.returnOverSeedCost !== null && referenceReturn !== null
              ? row.returnOverSeedCost - referenceReturn
              : null;
        return rows;
      })()
    : [];

  const findingsInput = analysis
    ? {
        analysis,
        rateLabels: labels,
        yieldUnit: units.yield,
        seedUnit,
        siteDifferences,
        sitesExcluded: excluded.map((e) => ({ name: e.site.fieldName, reason: e.reason })),
        economics,
        prices: { seedPricePerLb: seedPrice, grainPricePerBu: grainPrice },
        moneyUnit: units.money,
        priceUnits: reportDisplayUnits(units),
      }
    : null;
  const findings = findingsInput
    ? pooledFindings(findingsInput)
    : [analysisError ?? 'The pooled analysis is not available yet.'];
  const forStatistician = findingsInput ? pooledStatisticianNotes(findingsInput) : [];

  const distinct = (values: string[]) => [...new Set(values.filter((v) => v.trim() !== ''))].sort();
  return {
    trial: {
      id: trial.id,
      name: trial.name,
      question: trial.question,
      crop: trial.crop,
      cropName: cropNameOf(trial),
      season: trial.season,
      rates,
      reference,
      units: { ...units, seed: seedUnit },
    },
    analysis,
    analysisError,
    siteDifferences,
    siteMeans,
    sitesIncluded: included.map((entry) => entry.site),
    sitesExcluded: excluded,
    economics,
    prices: { seedPricePerLb: seedPrice, grainPricePerBu: grainPrice },
    filters: query,
    filterOptions: {
      soil: distinct(input.sites.map((s) => s.soil)),
      previousCrop: distinct(input.sites.map((s) => s.previousCrop)),
    },
    findings,
    forStatistician,
  };
}

function exclusionReason(site: PooledSite, trial: TrialFacts, query: PooledQuery): string | null {
  if (
    query.crop &&
    !(trial.crop && (same(query.crop, trial.crop) || same(query.crop, cropNameOf(trial) ?? '')))
  )
    return `crop is ${cropNameOf(trial) ?? 'not set'}, not ${query.crop}`;
  if (query.season && !(trial.season && same(query.season, trial.season)))
    return `season is ${trial.season ?? 'not set'}, not ${query.season}`;
  if (query.soil && !same(query.soil, site.soil))
    return `soil is ${site.soil || 'not recorded'} (filter: ${query.soil})`;
  if (query.previousCrop && !same(query.previousCrop, site.previousCrop))
    return `previous crop was ${site.previousCrop || 'not recorded'} (filter: ${query.previousCrop})`;
  if (query.sites === 'published' && !site.published) return 'site report not yet published';
  if (site.strips === 0) return 'no strips yet (not randomized)';
  if (site.stripsWithYield === 0) return 'no yields entered yet';
  if (site.stripsWithYield < MIN_COMPLETE_SHARE * site.strips)
    return `incomplete: ${site.stripsWithYield} of ${site.strips} strips have a yield`;
  return null;
}
