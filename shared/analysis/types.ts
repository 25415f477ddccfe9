// Input and result shapes of the trial analysis (plain TypeScript types, no zod).
import type { ResponseModels } from './fit-response-models';

/** One strip of a trial: the measured response (null when the strip is missing). */
export type StripObservation = {
  site: string;
  block: string;
  rate: string | number;
  value: number | null;
};

/** One strip of a single site. */
export type SiteStrip = { block: string; rate: string | number; value: number | null };

export type AnovaEffectRow = {
  source: string;
  df: number;
  ss: number;
  ms: number;
  f: number;
  p: number;
};
export type AnovaErrorRow = { source: string; df: number; ss: number; ms: number };
export type AnovaTotalRow = { source: 'total'; df: number; ss: number };
export type AnovaRow = AnovaEffectRow | AnovaErrorRow | AnovaTotalRow;

export type RateMean = {
  rate: string;
  n: number;
  mean: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  group: string;
};

export type RateDifference = {
  rate: string;
  diff: number;
  se: number;
  /** Unadjusted (1 − α) interval and t-test p: each comparison on its own. */
  ciLow: number;
  ciHigh: number;
  p: number;
  /** Dunnett (many-to-one) adjusted p: allows for comparing every rate with the reference. */
  pAdjusted?: number;
  /** Dunnett simultaneous (1 − α) interval: all of them hold together with probability 1 − α. */
  ciLowAdjusted?: number;
  ciHighAdjusted?: number;
};

export type MissingEstimate = {
  block: string;
  rate: string;
  /** Least-squares fitted value for the missing strip (= the iterative Yates estimate). */
  estimate: number;
  /** (rB + tT − G)/((r − 1)(t − 1)); only when exactly one strip is missing. */
  classicEstimate?: number;
};

export type StripResidual = {
  block: string;
  rate: string;
  value: number;
  fitted: number;
  residual: number;
  /** Externally studentized residual (R's `rstudent`); null when it is undefined. */
  studentized: number | null;
  /** Bonferroni-adjusted p of the outlier test (R's `car::outlierTest`); absent when undefined. */
  pBonferroni?: number;
};

/** A strip flagged by the Bonferroni outlier test (adjusted p below alpha). */
export type OutlierFlag = {
  block: string;
  rate: string;
  value: number;
  studentized: number;
  /** Unadjusted two-sided p of the studentized residual on error df − 1. */
  p: number;
  /** p × number of strips tested, capped at 1 (Bonferroni), as `car::outlierTest`. */
  pBonferroni: number;
};

export type SiteAnalysis = {
  site?: string;
  blocks: number;
  rates: number;
  missing: number;
  method: 'balanced' | 'least-squares';
  anova: AnovaRow[];
  errorMeanSquare: number;
  errorDf: number;
  grandMean: number;
  cvPercent: number;
  /** Standard error of a difference (average over pairs when strips are missing). */
  sed: number;
  lsd: number;
  /** Tukey's HSD; null when the site has fewer than 2 error df (no Tukey test). */
  hsd: number | null;
  alpha: number;
  reference: string;
  means: RateMean[];
  differences: RateDifference[];
  missingEstimates: MissingEstimate[];
  outliers: OutlierFlag[];
  residuals: StripResidual[];
  notes: string[];
};

export type Prices = {
  seedPricePerRateUnit: number;
  grainPricePerYieldUnit: number;
  rateUnit: string;
  yieldUnit: string;
};

export type OptimumFlag = 'beyond the tested rates' | 'curve not concave';

export type ResponseCurve = {
  model: 'quadratic';
  intercept: number;
  linear: number;
  quadratic: number;
  standardErrors: { intercept: number; linear: number; quadratic: number };
  rSquared: number;
  residualDf: number;
  points: number;
  testedRange: { low: number; high: number };
  /** Rate of maximum yield, −b1/(2·b2); null when outside the tested rates or not concave. */
  agronomicOptimum: number | null;
  agronomicOptimumFlag?: OptimumFlag;
  /** Rate where marginal yield value equals marginal seed cost; null as above. */
  economicOptimum?: number | null;
  economicOptimumFlag?: OptimumFlag;
  economics?: {
    seedPricePerRateUnit: number;
    grainPricePerYieldUnit: number;
    rateUnit: string;
    yieldUnit: string;
    /** Seed price ÷ grain price: yield units that pay for one rate unit of seed. */
    priceRatio: number;
    explanation: string;
  };
};

export type PooledMean = {
  rate: string;
  n: number;
  mean: number;
  se: number;
  ciLow: number;
  ciHigh: number;
};

export type SiteDifference = {
  site: string;
  rate: string;
  diff: number;
  se: number;
  ciLow: number;
  ciHigh: number;
  p: number;
};

export type PooledAnalysis = {
  sites: number;
  method: 'combined' | 'site-means';
  anova: AnovaRow[];
  rateTest: { f: number; df1: number; df2: number; p: number; errorTerm: 'site:rate' };
  grandMean: number;
  reference: string;
  alpha: number;
  means: PooledMean[];
  /** Difference of each rate's pooled mean from the reference, tested against site:rate. */
  differences: RateDifference[];
  bartlett?: { chiSquare: number; df: number; p: number };
  siteDifferences: SiteDifference[];
  curve?: ResponseCurve;
  /**
   * Quadratic, linear-plateau and quadratic-plateau curves with site effects removed, chosen
   * by AIC, with delta-method intervals for the optimum rates (absent when rates are not numeric).
   */
  curves?: ResponseModels;
  /** The mixed model (REML, Kenward–Roger) on every observed strip; absent when it cannot be fitted (see notes). */
  mixed?: MixedModelAnalysis;
  notes: string[];
};

export type AnalysisOptions = {
  reference?: string;
  alpha?: number;
  /** Add Dunnett-adjusted differences from the reference (a few ms per site; default false, the CLI's analyzeTrial default true). */
  manyToOne?: boolean;
};

export type PooledOptions = AnalysisOptions & {
  ratesNumeric?: Record<string, number>;
  prices?: Prices;
};

export type TrialOptions = PooledOptions & { response?: string };

export type TrialAnalysis = {
  response: string;
  reference: string;
  sites: (SiteAnalysis & { site: string })[];
  pooled?: PooledAnalysis;
};

/** The network mixed model (REML, Kenward–Roger) as the CLI prints it under `pooled.mixed`. */
export type MixedModelAnalysis = {
  method: 'REML';
  observations: number;
  sites: number;
  varianceComponents: {
    site: number;
    blockWithinSite: number;
    siteByRate: number;
    residual: number;
  };
  rateTest: { f: number; df1: number; df2: number; p: number; ddf: 'kenward-roger' };
  /** Expected yield at a farm like these: rate mean with KR-adjusted SE, KR df and (1 − α) CI. */
  means: { rate: string; mean: number; se: number; df: number; ciLow: number; ciHigh: number }[];
  /** Difference from the reference rate: unadjusted and Dunnett-adjusted (multivariate t, KR df). */
  differences: {
    rate: string;
    reference: string;
    estimate: number;
    se: number;
    df: number;
    ciLow: number;
    ciHigh: number;
    p: number;
    pAdjusted: number;
    ciLowAdjusted: number;
    ciHighAdjusted: number;
  }[];
  alpha: number;
  /** Plain-word captions of what each interval is. */
  captions: { means: string; differences: string };
  notes: string[];
};

/** One strip of a series of trials across seasons (site names need only be unique per season). */
export type SeriesStripObservation = StripObservation & { season: string };

/** The series mixed model across seasons (REML, Kenward–Roger). */
export type SeriesMixedModelAnalysis = Omit<MixedModelAnalysis, 'varianceComponents' | 'sites'> & {
  seasons: number;
  siteSeasons: number;
  varianceComponents: {
    season: number;
    seasonByRate: number;
    siteSeason: number;
    blockWithinSiteSeason: number;
    siteSeasonByRate: number;
    residual: number;
  };
  /** Components estimated as zero (on the boundary of the parameter space: a singular fit). */
  boundary: string[];
};

/** One season of a series: its own network mixed model beside the pooled one. */
export type SeriesSeason = {
  season: string;
  sites: number;
  observations: number;
  /** Plain mean of the observed strips per rate (null when the rate has no strip that season). */
  rawMeans: { rate: string; mean: number | null; strips: number }[];
  /** The season's own mixed model (as its trial's pooled report), when it can be fitted. */
  mixed: MixedModelAnalysis | null;
  note?: string;
};

/** How consistent the rate effect is across seasons. */
export type SeriesConsistency = {
  /** σ² season × rate and σ² site-season × rate: rate effects that move with the season vs the farm. */
  seasonByRate: number;
  siteSeasonByRate: number;
  /** σ² season × rate / (σ² season × rate + σ² site-season × rate); null when both are zero. */
  seasonShare: number | null;
  /** Per rate: in how many seasons it did as well as the reference (no detectable difference). */
  perRate: { rate: string; seasons: number; asWell: number; worse: number; better: number }[];
};

export type SeriesAnalysis = {
  reference: string;
  rateLevels: string[];
  alpha: number;
  pooled: SeriesMixedModelAnalysis | null;
  seasons: SeriesSeason[];
  consistency: SeriesConsistency | null;
  notes: string[];
};
