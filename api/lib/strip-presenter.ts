// Turns site and strip records into the collection DTOs (derived values, warnings, what is in);
// used by the strip, import and site-data features.
import { analyzeSite } from '../../shared/analysis/index';
import type { SiteContext, StripDto } from '../../shared/schemas/strip';
import { plotNumber } from '../../shared/units/plot-number';
import {
  cropFacts,
  deriveStripValues,
  outlierWarning,
  plausibilityWarnings,
  recordedGroups,
  yieldOutliers,
  type StripContext,
} from '../../shared/units/strip-derived';
import type { SiteRecord, StripRecord } from './strip-data';

export function stripContextFor(site: SiteRecord, multiplier: number): StripContext {
  return {
    unitSystem: site.unitSystem,
    crop: cropFacts(site.crop, site.customCrop),
    rowSpacingIn: site.rowSpacingIn,
    thousandKernelWeightG: site.thousandKernelWeightG,
    referenceRate: site.referenceRate,
    referenceUnit: site.referenceUnit,
    multiplier,
    seedPricePerLb: site.seedPricePerLb,
    grainPricePerBu: site.grainPricePerBu,
  };
}

export function presentSite(
  site: SiteRecord,
  access: { canEdit: boolean; isCoordinator: boolean },
): SiteContext {
  const crop = cropFacts(site.crop, site.customCrop);
  return {
    siteId: site.siteId,
    trialId: site.trialId,
    trialName: site.trialName,
    fieldName: site.fieldName,
    growerName: site.growerName,
    notes: site.notes,
    unitSystem: site.unitSystem,
    crop: site.crop,
    cropName: crop?.name ?? null,
    standardMoisturePercent: crop?.standardMoisturePercent ?? null,
    bushelPounds: crop?.bushelPounds ?? null,
    rateLevels: site.rateLevels,
    blocksPerSite: site.blocksPerSite,
    rowsPerStrip: site.rowsPerStrip,
    rowSpacingIn: site.rowSpacingIn,
    stripLengthFt: site.stripLengthFt,
    thousandKernelWeightG: site.thousandKernelWeightG,
    referenceRate: site.referenceRate,
    referenceUnit: site.referenceUnit,
    seedPricePerLb: site.seedPricePerLb,
    grainPricePerBu: site.grainPricePerBu,
    publishedAt: site.publishedAt,
    dataVersion: site.dataVersion,
    sowingDate: site.sowingDate,
    emergenceDate: site.emergenceDate,
    headingDate: site.headingDate,
    harvestDate: site.harvestDate,
    canEdit: access.canEdit && !site.publishedAt,
    isCoordinator: access.isCoordinator,
  };
}

/** DTOs for strips of one site; the outlier check looks at every strip of the site. */
export function presentStrips(
  site: SiteRecord,
  strips: readonly StripRecord[],
  allSiteStrips: readonly StripRecord[] = strips,
): StripDto[] {
  const crop = cropFacts(site.crop, site.customCrop);
  const derivedOf = (strip: StripRecord) =>
    deriveStripValues(strip.values, stripContextFor(site, strip.rate));
  const outliers = yieldOutliers(
    allSiteStrips.map((strip) => ({
      key: strip.stripId,
      block: strip.block,
      rate: strip.label,
      value: derivedOf(strip).yieldBushelsPerAcre,
    })),
    (rows) => analyzeSite(rows),
  );
  return strips.map((strip) => {
    const derived = derivedOf(strip);
    const warnings = plausibilityWarnings(strip.values, derived, crop);
    const adjustedP = outliers.get(strip.stripId);
    if (adjustedP !== undefined) warnings.push(outlierWarning(adjustedP));
    return {
      stripId: strip.stripId,
      siteId: strip.siteId,
      block: strip.block,
      position: strip.position,
      plotNumber: plotNumber(strip.block, strip.position),
      rateLevelId: strip.rateLevelId,
      rate: strip.rate,
      label: strip.label,
      version: strip.version,
      values: strip.values,
      derived,
      warnings,
      recorded: recordedGroups(strip.values),
      updatedAt: strip.updatedAt,
    };
  });
}
