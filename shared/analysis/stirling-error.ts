// Error term of Stirling's formula, the building block of accurate beta and gamma densities.

/**
 * Stirling's error δ(n) = log Γ(n + 1) − [(n + ½)·log n − n + log √(2π)] for real n > 0.
 * Above 15 the asymptotic series in 1/n is summed (terms 1/12, 1/360, 1/1260, 1/1680,
 * 1/1188, as R's `stirlerr`); below, δ(n) is carried up by the recurrence
 * Γ(n + 1) = Γ(n + k + 1) / ((n + 1)…(n + k)) so no approximate log-gamma is needed.
 *
 * Source: Loader, C. (2000) "Fast and accurate computation of binomial probabilities";
 * Abramowitz & Stegun (1964) 6.1.40–6.1.41.
 *
 * @param n - a positive real number
 * @returns δ(n), which is positive and about 1/(12n)
 * @throws Error when n is not a positive finite number
 * @example stirlingError(1) // 0.0810614667953273 (= 1 − log √(2π); R 4.2.2: 1 - log(sqrt(2*pi)))
 */
export function stirlingError(n: number): number {
  if (!(n > 0) || !Number.isFinite(n))
    throw new Error(`stirlingError needs a positive finite n (got ${n})`);
  if (n > 15) return series(n);
  // δ(n) = δ(m) + (m + ½)·log m − m − (n + ½)·log n + n − Σ log(n + j), m = n + k > 15.
  const steps = Math.floor(15 - n) + 1;
  const m = n + steps;
  let logProduct = 0;
  for (let j = 1; j <= steps; j++) logProduct += Math.log(n + j);
  return series(m) + (m + 0.5) * Math.log(m) - m - (n + 0.5) * Math.log(n) + n - logProduct;
}

function series(n: number): number {
  const s0 = 1 / 12;
  const s1 = 1 / 360;
  const s2 = 1 / 1260;
  const s3 = 1 / 1680;
  const s4 = 1 / 1188;
  const nn = n * n;
  if (n > 500) return (s0 - s1 / nn) / n;
  if (n > 80) return (s0 - (s1 - s2 / nn) / nn) / n;
  if (n > 35) return (s0 - (s1 - (s2 - s3 / nn) / nn) / nn) / n;
  return (s0 - (s1 - (s2 - (s3 - s4 / nn) / nn) / nn) / nn) / n;
}
