// REML fit of the network mixed model: rate fixed; site, block within site and site × rate random.
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix';
import { normalizeRate } from './normalize-rate';
import { sortRateLevels } from './sort-rate-levels';
import type { StripObservation } from './types';

/** The four variance components, in the order of the covariance matrices G_k. */
const COMPONENTS = ['site', 'blockWithinSite', 'siteByRate', 'residual'] as const;
type Component = (typeof COMPONENTS)[number];
const K = COMPONENTS.length;

/** Result of fitting y = rate + site + block(site) + site:rate + error by REML. */
export type MixedModelFit = {
  rateLevels: string[];
  observations: number;
  sites: number;
  varianceComponents: Record<Component, number>;
  /** REML estimates of the rate means (the fixed effects, one per rate). */
  coefficients: number[];
  /** (X′V⁻¹X)⁻¹: covariance of the rate means at the REML estimates. */
  covariance: number[][];
  /** Kenward–Roger adjusted covariance Φ_A = Φ + 2Λ. */
  adjustedCovariance: number[][];
  restrictedLogLikelihood: number;
  iterations: number;
  /**
   * Kenward–Roger test of the linear hypothesis L·β = 0 (L: q × rates): scaled Wald F
   * (pbkrtest's `KRmodcomp`), its scaling and denominator df.
   */
  kenwardRoger: (contrasts: readonly (readonly number[])[]) => {
    f: number;
    scaling: number;
    df1: number;
    df2: number;
  };
};

type Pattern = {
  key: string;
  n: number;
  rateOf: Int32Array;
  blockOf: Int32Array;
  blocks: number;
  count: number;
};
type SiteData = { pattern: Pattern; y: Float64Array };

/** Per-pattern quantities at one set of variance components (shared by every site alike). */
type PatternTerms = {
  inverse: Float64Array; // V⁻¹, n × n
  logDeterminant: number;
  vx: Float64Array; // V⁻¹X, n × t
  xvx: Float64Array; // X′V⁻¹X, t × t
  traceVG: Float64Array; // tr(V⁻¹G_k)
  traceVGVG: Float64Array; // tr(V⁻¹G_k V⁻¹G_l), K × K
  p: Float64Array[]; // X′V⁻¹G_kV⁻¹X, t × t each
  q: Float64Array[]; // X′V⁻¹G_kV⁻¹G_lV⁻¹X, t × t each, index k·K + l
};

/**
 * Fits the linear mixed model of a trial network by restricted maximum likelihood (REML):
 * rate as fixed effect (one mean per rate); site, block within site and site × rate as
 * independent random effects; independent strip errors. Every observed strip is used, so
 * sites may differ in blocks and miss strips. V is block-diagonal by site, and sites with the
 * same layout share V⁻¹, so the work grows with the number of distinct layouts, not sites.
 *
 * REML is maximised by Fisher scoring on the variance components, then Newton steps with the
 * observed information (exact Hessian) to converge tightly (relative change < 1e-12);
 * components that reach zero stay on the boundary while their score points outwards. The
 * Kenward–Roger adjusted covariance Φ_A = Φ + 2Φ[Σ W_kl (Q_kl − P_kΦP_l)]Φ and the KR test
 * (scaled F and denominator df) follow Kenward & Roger (1997) as implemented in R's pbkrtest.
 *
 * Source: Patterson & Thompson (1971) Biometrika 58:545–554 (REML); Searle, Casella &
 * McCulloch (1992) Variance Components, ch. 6 (REML scores and information); Kenward, M.G. &
 * Roger, J.H. (1997) Biometrics 53:983–997; Halekoh & Højsgaard (2014) J. Stat. Softw. 59(9)
 * (pbkrtest formulas); Smith, Cullis & Thompson (2005) J. Agric. Sci. 143:449–462 (mixed
 * models for multi-environment variety trials).
 *
 * @param rows - strips (site, block, rate, value; null = missing, left out)
 * @param rateLevels - rates to estimate, in order (default: every rate seen, sorted)
 * @returns variance components, rate means with Φ and Φ_A, and a Kenward–Roger test function
 * @throws Error with fewer than 2 sites, a rate without data, non-finite values, or when REML
 *   does not converge
 * @example fitNetworkMixedModel(rows).varianceComponents.siteByRate // REML σ² of site × rate (R: lmer)
 */
export function fitNetworkMixedModel(
  rows: readonly StripObservation[],
  rateLevels?: readonly string[],
): MixedModelFit {
  const levels = rateLevels
    ? rateLevels.map((rate) => normalizeRate(rate))
    : sortRateLevels([
        ...new Set(rows.filter((r) => r.value !== null).map((r) => normalizeRate(r.rate))),
      ]);
  const t = levels.length;
  if (t < 2) throw new Error(`fitNetworkMixedModel needs at least 2 rates (got ${t})`);
  const rateIndex = new Map(levels.map((rate, i) => [rate, i]));
  const bySite = new Map<string, { block: string; rate: number; value: number }[]>();
  for (const row of rows) {
    if (row.value === null) continue;
    if (!Number.isFinite(row.value))
      throw new Error('fitNetworkMixedModel needs finite values (or null for a missing strip)');
    const rate = rateIndex.get(normalizeRate(row.rate));
    if (rate === undefined) continue;
    const site = String(row.site).trim();
    let list = bySite.get(site);
    if (!list) bySite.set(site, (list = []));
    list.push({ block: String(row.block).trim(), rate, value: row.value });
  }
  if (bySite.size < 2)
    throw new Error(`fitNetworkMixedModel needs at least 2 sites with data (got ${bySite.size})`);
  const perRate = new Array<number>(t).fill(0);
  const patterns = new Map<string, Pattern>();
  const sites: SiteData[] = [];
  let total = 0;
  let totalSquares = 0;
  let observations = 0;
  for (const list of bySite.values()) {
    const blockNames = [...new Set(list.map((s) => s.block))].sort();
    const blockOf = new Map(blockNames.map((b, i) => [b, i]));
    const ordered = [...list].sort(
      (a, b) => blockOf.get(a.block)! - blockOf.get(b.block)! || a.rate - b.rate,
    );
    const key = ordered.map((s) => `${blockOf.get(s.block)}:${s.rate}`).join(',');
    let pattern = patterns.get(key);
    if (!pattern) {
      pattern = {
        key,
        n: ordered.length,
        rateOf: Int32Array.from(ordered, (s) => s.rate),
        blockOf: Int32Array.from(ordered, (s) => blockOf.get(s.block)!),
        blocks: blockNames.length,
        count: 0,
      };
      patterns.set(key, pattern);
    }
    pattern.count += 1;
    sites.push({ pattern, y: Float64Array.from(ordered, (s) => s.value) });
    for (const s of ordered) {
      perRate[s.rate]! += 1;
      total += s.value;
      totalSquares += s.value * s.value;
      observations += 1;
    }
  }
  levels.forEach((rate, i) => {
    if (perRate[i] === 0) throw new Error(`fitNetworkMixedModel: rate ${rate} has no data`);
  });
  const variance = (totalSquares - (total * total) / observations) / (observations - 1);
  if (!(variance > 0)) throw new Error('fitNetworkMixedModel: every strip has the same value');

  const evaluate = (theta: readonly number[]) => {
    const terms = new Map<Pattern, PatternTerms>();
    for (const pattern of patterns.values()) terms.set(pattern, patternTerms(pattern, theta, t));
    return assemble(sites, terms, t, observations);
  };

  // Start from an equal split of the total variance; Fisher scoring, then Newton.
  let theta = [variance / 4, variance / 4, variance / 4, variance / 4];
  let state = evaluate(theta);
  let iterations = 0;
  let converged = false;
  for (; iterations < 200 && !converged; iterations++) {
    const expected = state.expectedInformation;
    const observed = expected.map((row, k) =>
      row.map((value, l) => 2 * (state.averageInformation[k]![l] as number) - value),
    );
    const useNewton = iterations >= 3 && isPositiveDefinite(observed);
    const information = useNewton ? observed : expected;
    // Components at zero whose score points below zero stay there.
    const free = COMPONENTS.map((_, k) => k === K - 1 || theta[k]! > 0 || state.score[k]! > 0);
    const step = solveFree(information, state.score, free);
    let scale = 1;
    let accepted = false;
    for (let halving = 0; halving < 30; halving++) {
      const trial = theta.map((value, k) => Math.max(0, value + scale * step[k]!));
      if (!(trial[K - 1]! > 0)) {
        scale /= 2;
        continue;
      }
      const next = evaluate(trial);
      if (next.logLikelihood >= state.logLikelihood - 1e-12 * Math.abs(state.logLikelihood)) {
        const change = Math.max(
          ...trial.map(
            (value, k) => Math.abs(value - theta[k]!) / Math.max(value, 1e-6 * variance),
          ),
        );
        theta = trial;
        state = next;
        accepted = true;
        converged = change < 1e-12;
        break;
      }
      scale /= 2;
    }
    if (!accepted) converged = true; // No ascent direction left: at the maximum to rounding.
  }
  if (!converged) throw new Error('fitNetworkMixedModel: REML did not converge in 200 iterations');

  const phi = state.phi;
  // pbkrtest: W = 2·IE2⁻¹ with IE2_kl = tr(PG_kPG_l) = 2·(expected information)_kl.
  const wMatrix = inverse(new Matrix(state.expectedInformation)).to2DArray();
  const p = state.p;
  const correction = Matrix.zeros(t, t);
  for (let k = 0; k < K; k++) {
    for (let l = 0; l < K; l++) {
      const weight = wMatrix[k]![l]!;
      const term = state.q[k * K + l]!.clone().sub(p[k]!.mmul(phi).mmul(p[l]!));
      correction.add(term.mul(weight));
    }
  }
  const phiArray = phi.to2DArray();
  const adjusted = phi.clone().add(phi.mmul(correction).mmul(phi).mul(2));
  const beta = state.beta;

  const kenwardRoger = (contrasts: readonly (readonly number[])[]) => {
    const L = new Matrix(contrasts.map((row) => [...row]));
    const q = L.rows;
    const phiM = new Matrix(phiArray);
    const theta0 = L.transpose()
      .mmul(inverse(L.mmul(phiM).mmul(L.transpose())))
      .mmul(L);
    const u = p.map((pk) => theta0.mmul(phiM).mmul(pk).mmul(phiM));
    let a1 = 0;
    let a2 = 0;
    for (let k = 0; k < K; k++) {
      for (let l = 0; l < K; l++) {
        const weight = wMatrix[k]![l]!;
        a1 += weight * u[k]!.trace() * u[l]!.trace();
        a2 += weight * u[k]!.mmul(u[l]!).trace();
      }
    }
    const b = (a1 + 6 * a2) / (2 * q);
    const g = ((q + 1) * a1 - (q + 4) * a2) / ((q + 2) * a2);
    const denominator = 3 * q + 2 * (1 - g);
    const c1 = g / denominator;
    const c2 = (q - g) / denominator;
    const c3 = (q + 2 - g) / denominator;
    let v0 = 1 + c1 * b;
    if (Math.abs(v0) < 1e-10) v0 = 0;
    const v1 = 1 - c2 * b;
    const v2 = 1 - c3 * b;
    const rho = (1 / q) * ((1 - a2 / q) / v1) ** 2 * (v0 / v2);
    const df2 = 4 + (q + 2) / (q * rho - 1);
    const scaling = Math.abs(df2 - 2) < 1e-2 ? 1 : (df2 * (1 - a2 / q)) / (df2 - 2);
    const lb = L.mmul(Matrix.columnVector(beta));
    const wald = lb
      .transpose()
      .mmul(inverse(L.mmul(adjusted).mmul(L.transpose())))
      .mmul(lb)
      .get(0, 0);
    return { f: (scaling * wald) / q, scaling, df1: q, df2 };
  };

  return {
    rateLevels: levels,
    observations,
    sites: sites.length,
    varianceComponents: {
      site: theta[0]!,
      blockWithinSite: theta[1]!,
      siteByRate: theta[2]!,
      residual: theta[3]!,
    },
    coefficients: beta,
    covariance: phiArray,
    adjustedCovariance: adjusted.to2DArray(),
    restrictedLogLikelihood: state.logLikelihood,
    iterations,
    kenwardRoger,
  };
}

/** Whether two strips of a site share the random effect of component k. */
function shares(pattern: Pattern, k: number, i: number, j: number): boolean {
  if (k === 0) return true;
  if (k === 1) return pattern.blockOf[i] === pattern.blockOf[j];
  if (k === 2) return pattern.rateOf[i] === pattern.rateOf[j];
  return i === j;
}

function patternTerms(pattern: Pattern, theta: readonly number[], t: number): PatternTerms {
  const n = pattern.n;
  const v = new Matrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      let value = theta[0]!;
      if (pattern.blockOf[i] === pattern.blockOf[j]) value += theta[1]!;
      if (pattern.rateOf[i] === pattern.rateOf[j]) value += theta[2]!;
      if (i === j) value += theta[3]!;
      v.set(i, j, value);
    }
  }
  const cholesky = new CholeskyDecomposition(v);
  if (!cholesky.isPositiveDefinite())
    throw new Error('fitNetworkMixedModel: a site covariance matrix is not positive definite');
  const lower = cholesky.lowerTriangularMatrix;
  let logDeterminant = 0;
  for (let i = 0; i < n; i++) logDeterminant += 2 * Math.log(lower.get(i, i));
  const inv = Float64Array.from(cholesky.solve(Matrix.eye(n)).to1DArray());
  // V⁻¹X: column r sums the V⁻¹ columns of the strips at rate r.
  const vx = new Float64Array(n * t);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) vx[i * t + pattern.rateOf[j]!]! += inv[i * n + j]!;
  const xvx = new Float64Array(t * t);
  for (let i = 0; i < n; i++)
    for (let r = 0; r < t; r++) xvx[pattern.rateOf[i]! * t + r]! += vx[i * t + r]!;
  // V⁻¹G_k (n × n) and G_k·V⁻¹X (n × t) for each component.
  const vg: Float64Array[] = [];
  const gvx: Float64Array[] = [];
  for (let k = 0; k < K; k++) {
    const m = new Float64Array(n * n);
    const h = new Float64Array(n * t);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (!shares(pattern, k, i, j)) continue;
        for (let a = 0; a < n; a++) m[a * n + j]! += inv[a * n + i]!;
        for (let r = 0; r < t; r++) h[i * t + r]! += vx[j * t + r]!;
      }
    }
    vg.push(m);
    gvx.push(h);
  }
  const traceVG = new Float64Array(K);
  const traceVGVG = new Float64Array(K * K);
  for (let k = 0; k < K; k++) {
    const m = vg[k]!;
    for (let i = 0; i < n; i++) traceVG[k]! += m[i * n + i]!;
    for (let l = k; l < K; l++) {
      const o = vg[l]!;
      let sum = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) sum += m[i * n + j]! * o[j * n + i]!;
      traceVGVG[k * K + l] = sum;
      traceVGVG[l * K + k] = sum;
    }
  }
  // P_k = (V⁻¹X)′G_k(V⁻¹X); Q_kl = (G_kV⁻¹X)′V⁻¹(G_lV⁻¹X).
  const p: Float64Array[] = [];
  const vgvx: Float64Array[] = [];
  for (let k = 0; k < K; k++) {
    const h = gvx[k]!;
    const pk = new Float64Array(t * t);
    for (let i = 0; i < n; i++)
      for (let r = 0; r < t; r++)
        for (let s = 0; s < t; s++) pk[r * t + s]! += vx[i * t + r]! * h[i * t + s]!;
    p.push(pk);
    const z = new Float64Array(n * t);
    for (let i = 0; i < n; i++)
      for (let j = 0; j < n; j++) {
        const a = inv[i * n + j]!;
        for (let r = 0; r < t; r++) z[i * t + r]! += a * h[j * t + r]!;
      }
    vgvx.push(z);
  }
  const q: Float64Array[] = [];
  for (let k = 0; k < K; k++) {
    for (let l = 0; l < K; l++) {
      const h = gvx[k]!;
      const z = vgvx[l]!;
      const qkl = new Float64Array(t * t);
      for (let i = 0; i < n; i++)
        for (let r = 0; r < t; r++)
          for (let s = 0; s < t; s++) qkl[r * t + s]! += h[i * t + r]! * z[i * t + s]!;
      q.push(qkl);
    }
  }
  return { inverse: inv, logDeterminant, vx, xvx, traceVG, traceVGVG, p, q };
}

function assemble(
  sites: readonly SiteData[],
  terms: Map<Pattern, PatternTerms>,
  t: number,
  observations: number,
) {
  const xvx = Matrix.zeros(t, t);
  const p = Array.from({ length: K }, () => Matrix.zeros(t, t));
  const q = Array.from({ length: K * K }, () => Matrix.zeros(t, t));
  const traceVG = new Float64Array(K);
  const traceVGVG = new Float64Array(K * K);
  let logDeterminant = 0;
  for (const [pattern, term] of terms) {
    const c = pattern.count;
    logDeterminant += c * term.logDeterminant;
    for (let r = 0; r < t; r++)
      for (let s = 0; s < t; s++) {
        xvx.set(r, s, xvx.get(r, s) + c * term.xvx[r * t + s]!);
        for (let k = 0; k < K; k++) p[k]!.set(r, s, p[k]!.get(r, s) + c * term.p[k]![r * t + s]!);
        for (let kl = 0; kl < K * K; kl++)
          q[kl]!.set(r, s, q[kl]!.get(r, s) + c * term.q[kl]![r * t + s]!);
      }
    for (let k = 0; k < K; k++) traceVG[k]! += c * term.traceVG[k]!;
    for (let kl = 0; kl < K * K; kl++) traceVGVG[kl]! += c * term.traceVGVG[kl]!;
  }
  // Sums of rounded products are symmetric only to rounding; Cholesky needs exact symmetry.
  for (let r = 0; r < t; r++)
    for (let c = r + 1; c < t; c++) {
      const mean = (xvx.get(r, c) + xvx.get(c, r)) / 2;
      xvx.set(r, c, mean);
      xvx.set(c, r, mean);
    }
  const xvy = new Float64Array(t);
  let yvy = 0;
  const vy: Float64Array[] = [];
  for (const site of sites) {
    const term = terms.get(site.pattern)!;
    const n = site.pattern.n;
    const z = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      let sum = 0;
      for (let j = 0; j < n; j++) sum += term.inverse[i * n + j]! * site.y[j]!;
      z[i] = sum;
      yvy += site.y[i]! * sum;
      xvy[site.pattern.rateOf[i]!]! += sum;
    }
    vy.push(z);
  }
  const phi = inverse(xvx);
  const beta = Array.from({ length: t }, (_, r) => {
    let sum = 0;
    for (let s = 0; s < t; s++) sum += phi.get(r, s) * xvy[s]!;
    return sum;
  });
  let quadratic = yvy;
  for (let r = 0; r < t; r++) quadratic -= beta[r]! * xvy[r]!;
  const xvxDeterminant = new CholeskyDecomposition(xvx);
  let logXvx = 0;
  const lower = xvxDeterminant.lowerTriangularMatrix;
  for (let r = 0; r < t; r++) logXvx += 2 * Math.log(lower.get(r, r));
  const logLikelihood =
    -0.5 * (logDeterminant + logXvx + quadratic + (observations - t) * Math.log(2 * Math.PI));

  // Py = V⁻¹(y − Xβ̂) per site; w_k = G_k·Py; score and average information from them.
  const wv = Array.from({ length: K * K }, () => 0); // Σ w_k′V⁻¹w_l
  const xvw = Array.from({ length: K }, () => new Float64Array(t)); // Σ X′V⁻¹w_k
  const wpy = new Float64Array(K); // Σ Py′G_k Py
  sites.forEach((site, index) => {
    const term = terms.get(site.pattern)!;
    const pattern = site.pattern;
    const n = pattern.n;
    const py = Float64Array.from(vy[index]!);
    for (let i = 0; i < n; i++) {
      for (let r = 0; r < t; r++) py[i]! -= term.vx[i * t + r]! * beta[r]!;
    }
    // G_k·Py by group sums: site (all strips), block, rate, and Py itself for the residual.
    let siteSum = 0;
    const blockSum = new Float64Array(pattern.blocks);
    const rateSum = new Float64Array(t);
    for (let i = 0; i < n; i++) {
      siteSum += py[i]!;
      blockSum[pattern.blockOf[i]!]! += py[i]!;
      rateSum[pattern.rateOf[i]!]! += py[i]!;
    }
    const w: Float64Array[] = [
      new Float64Array(n).fill(siteSum),
      Float64Array.from(pattern.blockOf, (b) => blockSum[b]!),
      Float64Array.from(pattern.rateOf, (r) => rateSum[r]!),
      py,
    ];
    for (let k = 0; k < K; k++) {
      const wk = w[k]!;
      let sum = 0;
      for (let i = 0; i < n; i++) sum += py[i]! * wk[i]!;
      wpy[k]! += sum;
      for (let i = 0; i < n; i++)
        for (let r = 0; r < t; r++) xvw[k]![r]! += term.vx[i * t + r]! * wk[i]!;
    }
    for (let l = 0; l < K; l++) {
      const vw = new Float64Array(n);
      const wl = w[l]!;
      for (let i = 0; i < n; i++) {
        let sum = 0;
        for (let j = 0; j < n; j++) sum += term.inverse[i * n + j]! * wl[j]!;
        vw[i] = sum;
      }
      for (let k = 0; k <= l; k++) {
        let sum = 0;
        const wk = w[k]!;
        for (let i = 0; i < n; i++) sum += wk[i]! * vw[i]!;
        wv[k * K + l]! += sum;
        if (k !== l) wv[l * K + k]! += sum;
      }
    }
  });
  const trace = (a: Matrix, b: Matrix) => {
    let sum = 0;
    for (let r = 0; r < t; r++) for (let s = 0; s < t; s++) sum += a.get(r, s) * b.get(s, r);
    return sum;
  };
  const phiP = p.map((pk) => phi.mmul(pk));
  const score: number[] = [];
  const expectedInformation: number[][] = [];
  const averageInformation: number[][] = [];
  for (let k = 0; k < K; k++) {
    score.push(-0.5 * (traceVG[k]! - trace(phi, p[k]!)) + 0.5 * wpy[k]!);
    const expectedRow: number[] = [];
    const averageRow: number[] = [];
    for (let l = 0; l < K; l++) {
      const traceP =
        traceVGVG[k * K + l]! - 2 * trace(phi, q[k * K + l]!) + trace(phiP[k]!, phiP[l]!);
      expectedRow.push(0.5 * traceP);
      let projected = wv[k * K + l]!;
      for (let r = 0; r < t; r++)
        for (let s = 0; s < t; s++) projected -= xvw[k]![r]! * phi.get(r, s) * xvw[l]![s]!;
      averageRow.push(0.5 * projected);
    }
    expectedInformation.push(expectedRow);
    averageInformation.push(averageRow);
  }
  return { logLikelihood, beta, phi, p, q, score, expectedInformation, averageInformation };
}

function isPositiveDefinite(matrix: number[][]): boolean {
  const symmetric = matrix.map((row, k) => row.map((v, l) => (v + matrix[l]![k]!) / 2));
  return new CholeskyDecomposition(new Matrix(symmetric)).isPositiveDefinite();
}

/** Solves information·step = score over the free components; fixed ones get step 0. */
function solveFree(information: number[][], score: number[], free: boolean[]): number[] {
  const index = free.flatMap((isFree, k) => (isFree ? [k] : []));
  const sub = new Matrix(index.map((k) => index.map((l) => information[k]![l]!)));
  const solution = inverse(sub).mmul(Matrix.columnVector(index.map((k) => score[k]!)));
  const step = new Array<number>(K).fill(0);
  index.forEach((k, i) => (step[k] = solution.get(i, 0)));
  return step;
}
