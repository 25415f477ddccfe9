// Benchmarks the analysis engine: a 200-site pooled network and one 4 × 4 site.
import { analyzePooled, analyzeSite, type StripObservation } from '../shared/analysis/index';

/** Small seeded generator (mulberry32) so every run analyses the same invented network. */
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(random: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - random())) * Math.cos(2 * Math.PI * random());
}

function inventNetwork(
  sites: number,
  blocks: number,
  rates: readonly number[],
  seed: number,
): StripObservation[] {
  const random = generator(seed);
  const rows: StripObservation[] = [];
  for (let s = 0; s < sites; s++) {
    const siteMean = 50 + 10 * normal(random);
    for (let b = 0; b < blocks; b++) {
      const blockEffect = 2 * normal(random);
      for (const rate of rates) {
        const value = siteMean + blockEffect + 12 * rate - 4 * rate * rate + 3 * normal(random);
        rows.push({ site: `S${s + 1}`, block: `B${b + 1}`, rate, value });
      }
    }
  }
  return rows;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2
    ? (sorted[middle] as number)
    : ((sorted[middle - 1] as number) + (sorted[middle] as number)) / 2;
}

function time(run: () => unknown, repeats: number): { first: number; median: number } {
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  return { first: times[0] as number, median: median(times.slice(1)) };
}

const rates = [0.25, 0.5, 1, 2];
const network = inventNetwork(200, 6, rates, 20_270_401);
const site = inventNetwork(1, 4, rates, 7).map(({ block, rate, value }) => ({
  block,
  rate,
  value,
}));
const pooled = time(() => analyzePooled(network), 40);
const single = time(() => analyzeSite(site), 2000);
console.log(
  `pooled, 200 sites × 4 rates × 6 blocks (${network.length} strips): median ${pooled.median.toFixed(2)} ms (first run ${pooled.first.toFixed(1)} ms; target ≤ 20 ms)`,
);
console.log(
  `one site, 4 rates × 4 blocks: median ${single.median.toFixed(4)} ms (first run ${single.first.toFixed(2)} ms, includes the Tukey quantile before it is memoised; target ≤ 0.2 ms)`,
);
