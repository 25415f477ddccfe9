// The network mixed model's answers: variance components, rate test, rate means and differences.
import { adjustManyToOne } from './adjust-many-to-one';
import { fUpperTailP } from './f-upper-tail-p';
import { fitNetworkMixedModel } from './fit-network-mixed-model';
import { studentTQuantile } from './student-t-quantile';
import { studentTTwoSidedP } from './student-t-two-sided-p';
import type { MixedModelAnalysis, StripObservation } from './types';

/**
 * Fits the network mixed model (see fitNetworkMixedModel: rate fixed; site, block within
 * site and site × rate random; REML) and reports, with Kenward–Roger standard errors and
 * denominator df (pbkrtest's `vcovAdj`, `Lb_ddf`, `KRmodcomp`):
 * - the F test of equal rate means (scaled KR F on q = rates − 1 and the KR df);
 * - each rate's mean — the expected yield at a farm like these — with its KR SE, df and
 *   (1 − α) CI (as `emmeans(fit, ~rate, lmer.df = "kenward-roger")`);
 * - each rate's difference from the reference with its unadjusted CI and p (emmeans
 *   `trt.vs.ctrl`, `adjust = "none"`) and Dunnett-adjusted p and simultaneous CI from the
 *   multivariate t with the differences' KR correlation and each contrast's own KR df.
 *
 * Source: Kenward & Roger (1997) Biometrics 53:983–997; Halekoh & Højsgaard (2014) J. Stat.
 * Softw. 59(9); Dunnett (1955) JASA 50:1096–1121.
 *
 * @param rows - strips of every site (null = missing)
 * @param rateLevels - rate keys in order
 * @param reference - the reference rate key
 * @param alpha - 1 − confidence (default 0.05)
 * @returns the mixed-model analysis
 * @throws Error when the model cannot be fitted (see fitNetworkMixedModel)
 * @example analyzeNetworkMixedModel(rows, ['0.5', '1'], '1').rateTest.ddf // 'kenward-roger'
 */
export function analyzeNetworkMixedModel(
  rows: readonly StripObservation[],
  rateLevels: readonly string[],
  reference: string,
  alpha = 0.05,
): MixedModelAnalysis {
  const fit = fitNetworkMixedModel(rows, rateLevels);
  const t = fit.rateLevels.length;
  const referenceIndex = fit.rateLevels.indexOf(reference);
  if (referenceIndex < 0)
    throw new Error(`analyzeNetworkMixedModel: reference rate ${reference} is not a rate`);
  const unit = (i: number) => Array.from({ length: t }, (_, k) => (k === i ? 1 : 0));
  const contrast = (i: number) =>
    Array.from({ length: t }, (_, k) => (k === i ? 1 : k === referenceIndex ? -1 : 0));
  const others = fit.rateLevels.flatMap((_, i) => (i === referenceIndex ? [] : [i]));
  const test = fit.kenwardRoger(others.map(contrast));
  const adjusted = fit.adjustedCovariance;
  const quadratic = (a: readonly number[], b: readonly number[]) => {
    let sum = 0;
    for (let r = 0; r < t; r++) for (let s = 0; s < t; s++) sum += a[r]! * adjusted[r]![s]! * b[s]!;
    return sum;
  };
  const estimate = (l: readonly number[]) =>
    l.reduce((sum, weight, r) => sum + weight * fit.coefficients[r]!, 0);
  const means = fit.rateLevels.map((rate, i) => {
    const l = unit(i);
    const mean = estimate(l);
    const se = Math.sqrt(quadratic(l, l));
    const df = fit.kenwardRoger([l]).df2;
    const half = studentTQuantile(1 - alpha / 2, df) * se;
    return { rate, mean, se, df, ciLow: mean - half, ciHigh: mean + half };
  });
  const contrasts = others.map(contrast);
  const differences = others.map((i, index) => {
    const l = contrasts[index]!;
    const value = estimate(l);
    const se = Math.sqrt(quadratic(l, l));
    const df = fit.kenwardRoger([l]).df2;
    const half = studentTQuantile(1 - alpha / 2, df) * se;
    return {
      rate: fit.rateLevels[i]!,
      reference,
      estimate: value,
      se,
      df,
      ciLow: value - half,
      ciHigh: value + half,
      p: studentTTwoSidedP(value / se, df),
      pAdjusted: Number.NaN,
      ciLowAdjusted: Number.NaN,
      ciHighAdjusted: Number.NaN,
    };
  });
  adjustManyToOne(
    differences.map((d) => d.estimate),
    contrasts.map((a) => contrasts.map((b) => quadratic(a, b))),
    differences.map((d) => d.df),
    alpha,
  ).forEach((adjustment, index) => {
    const difference = differences[index]!;
    difference.pAdjusted = adjustment.pAdjusted;
    difference.ciLowAdjusted = adjustment.ciLowAdjusted;
    difference.ciHighAdjusted = adjustment.ciHighAdjusted;
  });
  const level = Math.round((1 - alpha) * 100);
  const notes: string[] = [
    'Mixed model: rate fixed; site, block within site and site × rate random; fitted by REML on every observed strip.',
    'Standard errors and degrees of freedom by Kenward–Roger.',
  ];
  const components = fit.varianceComponents;
  for (const [name, value] of Object.entries(components)) {
    if (value === 0 && name !== 'residual')
      notes.push(`The ${name} variance is estimated as zero (on the boundary).`);
  }
  return {
    method: 'REML',
    observations: fit.observations,
    sites: fit.sites,
    varianceComponents: components,
    rateTest: {
      f: test.f,
      df1: test.df1,
      df2: test.df2,
      p: fUpperTailP(test.f, test.df1, test.df2),
      ddf: 'kenward-roger',
    },
    means,
    differences,
    alpha,
    captions: {
      means: `Expected yield at a farm like these: each rate's mean over sites, with a ${level} % interval that allows for site-to-site differences.`,
      differences: `Difference from the reference rate (${reference}): "unadjusted" intervals and p treat each comparison on its own; "adjusted" (Dunnett) ones hold for all comparisons with the reference together.`,
    },
    notes,
  };
}
