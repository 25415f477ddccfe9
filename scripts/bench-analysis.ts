// Benchmarks the analysis engine: a 200-site pooled network, its mixed model (beside R's lmer when R is installed) and one 4 × 4 site.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import {
  analyzePooled,
  analyzeSite,
  analyzeSeries,
  fitNetworkMixedModel,
  fitSeriesMixedModel,
  type SeriesStripObservation,
  type StripObservation,
} from '../shared/analysis/index';

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
const singleDunnett = time(() => analyzeSite(site, { manyToOne: true }), 200);
console.log(
  `pooled, 200 sites × 4 rates × 6 blocks (${network.length} strips): median ${pooled.median.toFixed(2)} ms (first run ${pooled.first.toFixed(1)} ms; target ≤ 20 ms)`,
);
console.log(
  `one site, 4 rates × 4 blocks: median ${single.median.toFixed(4)} ms (first run ${single.first.toFixed(2)} ms, includes the Tukey quantile before it is memoised; target ≤ 0.2 ms)`,
);
console.log(
  `one site with Dunnett-adjusted differences: median ${singleDunnett.median.toFixed(2)} ms (first run ${singleDunnett.first.toFixed(1)} ms, includes the Dunnett critical value before it is memoised)`,
);

// The mixed model alone (REML + Kenward–Roger rate test). Wall time on a shared machine
// swings with other load, so the process CPU time per fit is printed too.
const mixedCpu: number[] = [];
const mixed = time(() => {
  const before = process.cpuUsage();
  const fit = fitNetworkMixedModel(network);
  fit.kenwardRoger([
    [1, 0, -1, 0],
    [0, 1, -1, 0],
    [0, 0, -1, 1],
  ]);
  const used = process.cpuUsage(before);
  mixedCpu.push((used.user + used.system) / 1000);
}, 20);
console.log(
  `mixed model (REML + Kenward–Roger rate test), 200 sites × 4 rates × 6 blocks: median ${mixed.median.toFixed(1)} ms wall, ${median(mixedCpu.slice(1)).toFixed(1)} ms CPU (first run ${mixed.first.toFixed(1)} ms; target ≤ 100 ms)`,
);

// The series model (seasons): 2 seasons × 100 sites × 4 rates × 4 blocks, a season shift and a
// season × rate effect on top of the invented network.
const series: SeriesStripObservation[] = [2026, 2027].flatMap((season, index) =>
  inventNetwork(100, 4, rates, 20_260_000 + season).map((row) => ({
    ...row,
    season: String(season),
    value: (row.value as number) - 4 * index + (index ? 1.5 : -1.5) * Number(row.rate),
  })),
);
const seriesFit = time(() => {
  const fit = fitSeriesMixedModel(series);
  fit.kenwardRoger([
    [1, 0, -1, 0],
    [0, 1, -1, 0],
    [0, 0, -1, 1],
  ]);
}, 10);
const seriesWhole = time(() => analyzeSeries(series, ['0.25', '0.5', '1', '2'], '1'), 5);
console.log(
  `series model (REML + Kenward–Roger rate test), 2 seasons × 100 sites × 4 rates × 4 blocks (${series.length} strips): median ${seriesFit.median.toFixed(1)} ms (first run ${seriesFit.first.toFixed(1)} ms); whole series analysis with each season's own model and Dunnett: median ${seriesWhole.median.toFixed(1)} ms`,
);

// The same data in R's lmer + pbkrtest, side by side, when R is installed.
const hasR = spawnSync('Rscript', ['--version'], { encoding: 'utf8' }).status === 0;
if (!hasR) {
  console.log('R lmer: skipped (Rscript not installed)');
} else {
  const folder = mkdtempSync(path.join(tmpdir(), 'sheaf-bench-r-'));
  const csv = path.join(folder, 'network.csv');
  writeFileSync(
    csv,
    `site,block,rate,value\n${network.map((r) => `${r.site},${r.block},${r.rate},${r.value}`).join('\n')}\n`,
  );
  const script = `
suppressMessages({ library(lme4); library(pbkrtest) })
d <- read.csv("${csv}")
d$rate <- factor(d$rate); d$block <- factor(paste(d$site, d$block))
times <- sapply(1:5, function(i) system.time({
  fit <<- lmer(value ~ 0 + rate + (1 | site) + (1 | block) + (1 | site:rate), data = d, REML = TRUE)
})[["elapsed"]])
L <- cbind(diag(3), -1)
kr <- system.time(KRmodcomp(fit, L))[["elapsed"]]
cat(sprintf("R lmer (lme4 %s), same data: median %.1f ms per fit; pbkrtest KR test %.1f ms\\n",
  as.character(packageVersion("lme4")), 1000 * median(times), 1000 * kr))
`;
  const result = spawnSync('Rscript', ['-e', script], { encoding: 'utf8' });
  process.stdout.write(
    result.status === 0
      ? result.stdout
      : `R lmer: failed (${result.stderr.trim().split('\n').pop()})\n`,
  );
  rmSync(folder, { recursive: true, force: true });
}
