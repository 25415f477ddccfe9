// Rate test, rate means and differences from the reference of a fitted REML mixed model.
import { adjustManyToOne } from './adjust-many-to-one';
import { fUpperTailP } from './f-upper-tail-p';
import type { NestedMixedModelFit } from './fit-nested-mixed-model';
import { studentTQuantile } from './student-t-quantile';
import { studentTTwoSidedP } from './student-t-two-sided-p';
import type { MixedModelAnalysis } from './types';

type MixedSummary = Pick<MixedModelAnalysis, 'rateTest' | 'means' | 'differences'>;

/**
 * From a fitted mixed model (network or series), with Kenward–Roger standard errors and
 * denominator df (pbkrtest's `vcovAdj`, `Lb_ddf`, `KRmodcomp`):
 * - the F test of equal rate means (scaled KR F on q = rates − 1 and the KR df);
 * - each rate's mean with its KR SE, df and (1 − α) CI (as `emmeans(fit, ~rate,
 *   lmer.df = "kenward-roger")`);
 * - each rate's difference from the reference with its unadjusted CI and p (emmeans
 *   `trt.vs.ctrl`, `adjust = "none"`) and Dunnett-adjusted p and simultaneous CI from the
 *   multivariate t with the differences' KR correlation and each contrast's own KR df.
 *
 * Source: Kenward & Roger (1997) Biometrics 53:983–997; Halekoh & Højsgaard (2014) J. Stat.
 * Softw. 59(9); Dunnett (1955) JASA 50:1096–1121.
 *
 * @param fit - the REML fit (rate levels, coefficients, adjusted covariance, KR test)
 * @param reference - the reference rate key
 * @param alpha - 1 − confidence
 * @returns rate test, means and differences
 * @throws Error when the reference is not one of the fit's rates
 * @example summarizeMixedFit(fit, '1', 0.05).rateTest.ddf // 'kenward-roger'
 */
export function summarizeMixedFit(
  fit: Pick<
    NestedMixedModelFit,
    'rateLevels' | 'coefficients' | 'adjustedCovariance' | 'kenwardRoger'
  >,
  reference: string,
  alpha: number,
): MixedSummary {
  const t = fit.rateLevels.length;
  const referenceIndex = fit.rateLevels.indexOf(reference);
  if (referenceIndex < 0)
    throw new Error(`summarizeMixedFit: reference rate ${reference} is not a rate`);
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
  return {
    rateTest: {
      f: test.f,
      df1: test.df1,
      df2: test.df2,
      p: fUpperTailP(test.f, test.df1, test.df2),
      ddf: 'kenward-roger',
    },
    means,
    differences,
  };
}
