// The REML engine behind the network and series mixed models: rate fixed; site (a site in a
// season), block within site and site × rate random; optionally season and season × rate random.
import { CholeskyDecomposition, LuDecomposition, Matrix, inverse } from 'ml-matrix';
import { normalizeRate } from './normalize-rate';
import { sortRateLevels } from './sort-rate-levels';
import type { StripObservation } from './types';

/** Components inside one site, in the order of the covariance matrices G_k. */
const SITE_COMPONENTS = 4;
/** Index of the residual variance (always free, always positive). */
const RESIDUAL = 3;

/** A strip with the season it belongs to (ignored unless the season level is fitted). */
export type SeasonStripObservation = StripObservation & { season?: string };

/**
 * Result of the REML fit. `components` are in the order site, block within site, site × rate,
 * residual and, with the season level, season and season × rate.
 */
export type NestedMixedModelFit = {
  rateLevels: string[];
  observations: number;
  sites: number;
  seasons: number;
  components: number[];
  /** REML estimates of the rate means (the fixed effects, one per rate). */
  coefficients: number[];
  /** (X′V⁻¹X)⁻¹: covariance of the rate means at the REML estimates. */
  covariance: number[][];
  /** Kenward–Roger adjusted covariance Φ_A = Φ + 2Λ. */
  adjustedCovariance: number[][];
  restrictedLogLikelihood: number;
  iterations: number;
  /** Kenward–Roger test of L·β = 0 (L: q × rates): scaled Wald F, its scaling and df. */
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
};
type SiteData = { pattern: Pattern; y: Float64Array };
type SeasonData = { sites: SiteData[]; counts: Map<Pattern, number> };

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
 * Fits y = rate + [season + season:rate] + site + block(site) + site:rate + error by REML.
 * Sites are nested in seasons; V is block-diagonal by season, and within a season it is the
 * block-diagonal site part B plus X·Σ·X′ with Σ = σ²_season·J + σ²_season×rate·I (X: the rate
 * indicators). The season part is folded in by the Woodbury identity and the matrix
 * determinant lemma (V⁻¹ = B⁻¹ − B⁻¹X·H·X′B⁻¹ with H = Σ(I + X′B⁻¹XΣ)⁻¹), so every trace the
 * REML scores, information and Kenward–Roger need is a t × t product per season, and sites
 * with the same layout share their B⁻¹: the work grows with the layouts, not the sites.
 *
 * REML is maximised by Fisher scoring on the variance components, then Newton steps with the
 * observed information (exact Hessian) to converge tightly (relative change < 1e-12);
 * components that reach zero stay on the boundary while their score points outwards (as
 * lme4's bounded optimiser leaves them at zero: a "singular" fit). The Kenward–Roger adjusted
 * covariance Φ_A = Φ + 2Φ[Σ W_kl (Q_kl − P_kΦP_l)]Φ and the KR test follow Kenward & Roger
 * (1997) as implemented in R's pbkrtest.
 *
 * Source: Patterson & Thompson (1971) Biometrika 58:545–554 (REML); Searle, Casella &
 * McCulloch (1992) Variance Components, ch. 6 (REML scores and information) and ch. 8
 * (Woodbury identity, determinant lemma); Kenward & Roger (1997) Biometrics 53:983–997;
 * Halekoh & Højsgaard (2014) J. Stat. Softw. 59(9) (pbkrtest formulas); Smith, Cullis &
 * Thompson (2005) J. Agric. Sci. 143:449–462 (multi-environment trials).
 *
 * @param rows - strips (season, site, block, rate, value; null = missing, left out)
 * @param options - rate levels in order (default every rate seen, sorted); `seasonLevel` adds
 *   the season and season × rate components; `caller` names the public function in errors
 * @returns variance components, rate means with Φ and Φ_A, and a Kenward–Roger test function
 * @throws Error with fewer than 2 sites, a rate without data, non-finite values, or when REML
 *   does not converge
 * @example fitNestedMixedModel(rows, { seasonLevel: true, caller: 'f' }).components[5] // σ² season × rate
 */
export function fitNestedMixedModel(
  rows: readonly SeasonStripObservation[],
  options: { rateLevels?: readonly string[]; seasonLevel: boolean; caller: string },
): NestedMixedModelFit {
  const { seasonLevel, caller } = options;
  const K = seasonLevel ? SITE_COMPONENTS + 2 : SITE_COMPONENTS;
  const levels = options.rateLevels
    ? options.rateLevels.map((rate) => normalizeRate(rate))
    : sortRateLevels([
        ...new Set(rows.filter((r) => r.value !== null).map((r) => normalizeRate(r.rate))),
      ]);
  const t = levels.length;
  if (t < 2) throw new Error(`${caller} needs at least 2 rates (got ${t})`);
  const rateIndex = new Map(levels.map((rate, i) => [rate, i]));
  const bySeason = new Map<string, Map<string, { block: string; rate: number; value: number }[]>>();
  for (const row of rows) {
    if (row.value === null) continue;
    if (!Number.isFinite(row.value))
      throw new Error(`${caller} needs finite values (or null for a missing strip)`);
    const rate = rateIndex.get(normalizeRate(row.rate));
    if (rate === undefined) continue;
    const season = seasonLevel ? String(row.season ?? '').trim() : '';
    let seasonSites = bySeason.get(season);
    if (!seasonSites) bySeason.set(season, (seasonSites = new Map()));
    const site = String(row.site).trim();
    let list = seasonSites.get(site);
    if (!list) seasonSites.set(site, (list = []));
    list.push({ block: String(row.block).trim(), rate, value: row.value });
  }
  const siteCount = [...bySeason.values()].reduce((sum, s) => sum + s.size, 0);
  if (siteCount < 2)
    throw new Error(`${caller} needs at least 2 sites with data (got ${siteCount})`);
  if (seasonLevel && bySeason.size < 2)
    throw new Error(`${caller} needs at least 2 seasons with data (got ${bySeason.size})`);
  const perRate = new Array<number>(t).fill(0);
  const patterns = new Map<string, Pattern>();
  const seasons: SeasonData[] = [];
  let total = 0;
  let totalSquares = 0;
  let observations = 0;
  for (const seasonSites of bySeason.values()) {
    const season: SeasonData = { sites: [], counts: new Map() };
    seasons.push(season);
    for (const list of seasonSites.values()) {
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
        };
        patterns.set(key, pattern);
      }
      season.counts.set(pattern, (season.counts.get(pattern) ?? 0) + 1);
      season.sites.push({ pattern, y: Float64Array.from(ordered, (s) => s.value) });
      for (const s of ordered) {
        perRate[s.rate]! += 1;
        total += s.value;
        totalSquares += s.value * s.value;
        observations += 1;
      }
    }
  }
  levels.forEach((rate, i) => {
    if (perRate[i] === 0) throw new Error(`${caller}: rate ${rate} has no data`);
  });
  const variance = (totalSquares - (total * total) / observations) / (observations - 1);
  if (!(variance > 0)) throw new Error(`${caller}: every strip has the same value`);

  const evaluate = (theta: readonly number[]) => {
    const terms = new Map<Pattern, PatternTerms>();
    for (const pattern of patterns.values())
      terms.set(pattern, patternTerms(pattern, theta, t, caller));
    return assemble(seasons, terms, theta, t, K, observations);
  };

  // Start from an equal split of the total variance; Fisher scoring, then Newton.
  let theta = new Array<number>(K).fill(variance / K);
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
    const free = theta.map((value, k) => k === RESIDUAL || value > 0 || state.score[k]! > 0);
    const step = solveFree(information, state.score, free);
    let scale = 1;
    let accepted = false;
    for (let halving = 0; halving < 30; halving++) {
      const trial = theta.map((value, k) => Math.max(0, value + scale * step[k]!));
      if (!(trial[RESIDUAL]! > 0)) {
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
  if (!converged) throw new Error(`${caller}: REML did not converge in 200 iterations`);

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
    sites: siteCount,
    seasons: seasonLevel ? seasons.length : 0,
    components: theta,
    coefficients: beta,
    covariance: phiArray,
    adjustedCovariance: adjusted.to2DArray(),
    restrictedLogLikelihood: state.logLikelihood,
    iterations,
    kenwardRoger,
  };
}

/** Whether two strips of a site share the random effect of site-level component k. */
function shares(pattern: Pattern, k: number, i: number, j: number): boolean {
  if (k === 0) return true;
  if (k === 1) return pattern.blockOf[i] === pattern.blockOf[j];
  if (k === 2) return pattern.rateOf[i] === pattern.rateOf[j];
  return i === j;
}

function patternTerms(
  pattern: Pattern,
  theta: readonly number[],
  t: number,
  caller: string,
): PatternTerms {
  const K = SITE_COMPONENTS;
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
    throw new Error(`${caller}: a site covariance matrix is not positive definite`);
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

type SeasonTerms = { m: Float64Array; M: Matrix; h: Matrix | null; T: Matrix | null };

/** Adds c times a t × t array to a matrix. */
function addScaled(target: Matrix, values: Float64Array, c: number, t: number): void {
  for (let r = 0; r < t; r++)
    for (let s = 0; s < t; s++) target.set(r, s, target.get(r, s) + c * values[r * t + s]!);
}

/** Sums of rounded products are symmetric only to rounding; Cholesky needs exact symmetry. */
function symmetrize(matrix: Matrix): Matrix {
  for (let r = 0; r < matrix.rows; r++)
    for (let c = r + 1; c < matrix.rows; c++) {
      const mean = (matrix.get(r, c) + matrix.get(c, r)) / 2;
      matrix.set(r, c, mean);
      matrix.set(c, r, mean);
    }
  return matrix;
}

/** tr(A·B) of two square matrices. */
function trace(a: Matrix, b: Matrix): number {
  let sum = 0;
  for (let r = 0; r < a.rows; r++)
    for (let s = 0; s < a.rows; s++) sum += a.get(r, s) * b.get(s, r);
  return sum;
}

function assemble(
  seasons: readonly SeasonData[],
  terms: Map<Pattern, PatternTerms>,
  theta: readonly number[],
  t: number,
  K: number,
  observations: number,
) {
  const S = SITE_COMPONENTS;
  const seasonLevel = K > S;
  const xvx = Matrix.zeros(t, t);
  const p = Array.from({ length: K }, () => Matrix.zeros(t, t));
  const q = Array.from({ length: K * K }, () => Matrix.zeros(t, t));
  const traceVG = new Float64Array(K);
  const traceVGVG = new Float64Array(K * K);
  const xvy = new Float64Array(t);
  let yvy = 0;
  let logDeterminant = 0;
  const identity = Matrix.eye(t);
  const ones = Matrix.ones(t, t);
  /** X·E_e·X′ is the covariance pattern of the season (E = J) and season × rate (E = I) effects. */
  const seasonPatterns = [ones, identity];
  const seasonTerms: SeasonTerms[] = [];
  const vy: Float64Array[][] = [];
  for (const season of seasons) {
    // Site-level sums over the season: M = X′B⁻¹X, R_k = X′B⁻¹G_kB⁻¹X, S_kl likewise.
    const M = Matrix.zeros(t, t);
    const R = Array.from({ length: S }, () => Matrix.zeros(t, t));
    const Q = Array.from({ length: S * S }, () => Matrix.zeros(t, t));
    const siteTraceVG = new Float64Array(S);
    const siteTraceVGVG = new Float64Array(S * S);
    for (const [pattern, c] of season.counts) {
      const term = terms.get(pattern)!;
      logDeterminant += c * term.logDeterminant;
      addScaled(M, term.xvx, c, t);
      for (let k = 0; k < S; k++) {
        addScaled(R[k]!, term.p[k]!, c, t);
        siteTraceVG[k]! += c * term.traceVG[k]!;
      }
      for (let kl = 0; kl < S * S; kl++) {
        addScaled(Q[kl]!, term.q[kl]!, c, t);
        siteTraceVGVG[kl]! += c * term.traceVGVG[kl]!;
      }
    }
    symmetrize(M);
    // B⁻¹y per site, m = X′B⁻¹y and y′B⁻¹y over the season.
    const m = new Float64Array(t);
    let yby = 0;
    const seasonVy: Float64Array[] = [];
    for (const site of season.sites) {
      const term = terms.get(site.pattern)!;
      const n = site.pattern.n;
      const z = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        let sum = 0;
        for (let j = 0; j < n; j++) sum += term.inverse[i * n + j]! * site.y[j]!;
        z[i] = sum;
        yby += site.y[i]! * sum;
        m[site.pattern.rateOf[i]!]! += sum;
      }
      seasonVy.push(z);
    }
    vy.push(seasonVy);
    if (!seasonLevel) {
      xvx.add(M);
      for (let k = 0; k < S; k++) {
        p[k]!.add(R[k]!);
        traceVG[k]! += siteTraceVG[k]!;
        for (let l = 0; l < S; l++) {
          q[k * K + l]!.add(Q[k * S + l]!);
          traceVGVG[k * K + l]! += siteTraceVGVG[k * S + l]!;
        }
      }
      for (let r = 0; r < t; r++) xvy[r]! += m[r]!;
      yvy += yby;
      seasonTerms.push({ m, M, h: null, T: null });
      continue;
    }
    // Woodbury: V⁻¹ = B⁻¹ − B⁻¹X·H·X′B⁻¹, H = Σ(I + MΣ)⁻¹; X′V⁻¹ = T·X′B⁻¹ with T = I − MH.
    const sigma = ones
      .clone()
      .mul(theta[S]!)
      .add(identity.clone().mul(theta[S + 1]!));
    const a = identity.clone().add(M.mmul(sigma));
    logDeterminant += Math.log(new LuDecomposition(a).determinant);
    const h = symmetrize(sigma.mmul(inverse(a)));
    const T = identity.clone().sub(M.mmul(h));
    const Tt = T.transpose();
    const N = symmetrize(T.mmul(M)); // X′V⁻¹X of the season
    xvx.add(N);
    const siteP = R.map((r) => T.mmul(r).mmul(Tt));
    const hR = R.map((r) => h.mmul(r));
    const seasonNE = seasonPatterns.map((e) => N.mmul(e));
    for (let k = 0; k < S; k++) {
      traceVG[k]! += siteTraceVG[k]! - trace(h, R[k]!);
      p[k]!.add(siteP[k]!);
      for (let l = 0; l < S; l++) {
        traceVGVG[k * K + l]! +=
          siteTraceVGVG[k * S + l]! -
          trace(h, Q[l * S + k]!) -
          trace(h, Q[k * S + l]!) +
          trace(hR[k]!, hR[l]!);
        const middle = Q[k * S + l]!.clone().sub(R[k]!.mmul(h).mmul(R[l]!));
        q[k * K + l]!.add(T.mmul(middle).mmul(Tt));
      }
      seasonPatterns.forEach((e, index) => {
        const l = S + index;
        const value = trace(e, siteP[k]!);
        traceVGVG[k * K + l]! += value;
        traceVGVG[l * K + k]! += value;
        q[k * K + l]!.add(siteP[k]!.mmul(e).mmul(N));
        q[l * K + k]!.add(seasonNE[index]!.mmul(siteP[k]!));
      });
    }
    seasonPatterns.forEach((e, index) => {
      const k = S + index;
      traceVG[k]! += trace(e, N);
      p[k]!.add(seasonNE[index]!.mmul(N));
      seasonNE.forEach((ne, other) => {
        const l = S + other;
        traceVGVG[k * K + l]! += trace(seasonNE[index]!, ne);
        q[k * K + l]!.add(seasonNE[index]!.mmul(ne).mmul(N));
      });
    });
    const tm = T.mmul(Matrix.columnVector(Array.from(m)));
    const hm = h.mmul(Matrix.columnVector(Array.from(m)));
    for (let r = 0; r < t; r++) {
      xvy[r]! += tm.get(r, 0);
      yvy -= m[r]! * hm.get(r, 0);
    }
    yvy += yby;
    seasonTerms.push({ m, M, h, T });
  }
  symmetrize(xvx);
  const phi = inverse(xvx);
  const beta = Array.from({ length: t }, (_, r) => {
    let sum = 0;
    for (let s = 0; s < t; s++) sum += phi.get(r, s) * xvy[s]!;
    return sum;
  });
  let quadratic = yvy;
  for (let r = 0; r < t; r++) quadratic -= beta[r]! * xvy[r]!;
  const lower = new CholeskyDecomposition(xvx).lowerTriangularMatrix;
  let logXvx = 0;
  for (let r = 0; r < t; r++) logXvx += 2 * Math.log(lower.get(r, r));
  const logLikelihood =
    -0.5 * (logDeterminant + logXvx + quadratic + (observations - t) * Math.log(2 * Math.PI));

  // Py = V⁻¹(y − Xβ̂) per site; w_k = G_k·Py; score and average information from them.
  const wv = Array.from({ length: K * K }, () => 0); // Σ w_k′V⁻¹w_l
  const xvw = Array.from({ length: K }, () => new Float64Array(t)); // Σ X′V⁻¹w_k
  const wpy = new Float64Array(K); // Σ Py′G_k Py
  seasons.forEach((season, seasonIndex) => {
    const { m, M, h, T } = seasonTerms[seasonIndex]!;
    // The season's share of Py: B⁻¹X·g with g = H·X′B⁻¹(y − Xβ̂).
    let g: Float64Array | null = null;
    if (h) {
      const u = Array.from(m, (value, r) => {
        let sum = value;
        for (let s = 0; s < t; s++) sum -= M.get(r, s) * beta[s]!;
        return sum;
      });
      g = Float64Array.from(h.mmul(Matrix.columnVector(u)).to1DArray());
    }
    const pys = season.sites.map((site, index) => {
      const term = terms.get(site.pattern)!;
      const py = Float64Array.from(vy[seasonIndex]![index]!);
      for (let i = 0; i < site.pattern.n; i++) {
        for (let r = 0; r < t; r++) py[i]! -= term.vx[i * t + r]! * (beta[r]! + (g ? g[r]! : 0));
      }
      return py;
    });
    let seasonSum = 0;
    const seasonRateSum = new Float64Array(t);
    season.sites.forEach((site, index) => {
      const py = pys[index]!;
      for (let i = 0; i < site.pattern.n; i++) {
        seasonSum += py[i]!;
        seasonRateSum[site.pattern.rateOf[i]!]! += py[i]!;
      }
    });
    const f = Array.from({ length: K }, () => new Float64Array(t)); // Σ X′B⁻¹w_k
    const wb = new Float64Array(K * K); // Σ w_k′B⁻¹w_l
    season.sites.forEach((site, index) => {
      const term = terms.get(site.pattern)!;
      const pattern = site.pattern;
      const n = pattern.n;
      const py = pys[index]!;
      // G_k·Py by group sums: site (all strips), block, rate, Py itself; season, season × rate.
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
      if (K > S) {
        w.push(new Float64Array(n).fill(seasonSum));
        w.push(Float64Array.from(pattern.rateOf, (r) => seasonRateSum[r]!));
      }
      for (let k = 0; k < K; k++) {
        const wk = w[k]!;
        let sum = 0;
        for (let i = 0; i < n; i++) sum += py[i]! * wk[i]!;
        wpy[k]! += sum;
        for (let i = 0; i < n; i++)
          for (let r = 0; r < t; r++) f[k]![r]! += term.vx[i * t + r]! * wk[i]!;
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
          wb[k * K + l]! += sum;
          if (k !== l) wb[l * K + k]! += sum;
        }
      }
    });
    const hf = h ? f.map((fk) => h.mmul(Matrix.columnVector(Array.from(fk))).to1DArray()) : null;
    for (let k = 0; k < K; k++) {
      for (let l = 0; l < K; l++) {
        let value = wb[k * K + l]!;
        if (hf) for (let r = 0; r < t; r++) value -= f[k]![r]! * hf[l]![r]!;
        wv[k * K + l]! += value;
      }
      if (T) {
        const tf = T.mmul(Matrix.columnVector(Array.from(f[k]!)));
        for (let r = 0; r < t; r++) xvw[k]![r]! += tf.get(r, 0);
      } else for (let r = 0; r < t; r++) xvw[k]![r]! += f[k]![r]!;
    }
  });
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
  const step = new Array<number>(score.length).fill(0);
  index.forEach((k, i) => (step[k] = solution.get(i, 0)));
  return step;
}
