// npm run bench: analysis timings; the HTTP endpoints at fixed arrival rates against their p99
// budgets and at saturation, with the server at each worker count; a 5,000-row CSV import; the
// web bundle a first visit loads. Prints a table and writes .data/bench-results.json.
//
// Settings (environment):
//   BENCH_WORKERS      server worker counts to measure, in order (WEB_CONCURRENCY), default "2,1"
//   BENCH_DURATION     seconds recorded per measurement, default 20
//   BENCH_WARMUP       unrecorded seconds of the same load before each, default 5
//   BENCH_CONNECTIONS  connections of the saturation runs, default 50
//   BENCH_ONLY         parts to run: analysis, site, pooled, patch, import, bundle, lighthouse
//                      (comma list; lighthouse: mobile emulation, simulated slow 4G, 4× CPU).
//                      "analysis" alone needs no web build and no PostgreSQL.
//   BENCH_PROFILE      folder: start the server with --cpu-prof and leave its CPU profiles there
//   BENCH_LIGHTHOUSE_RUNS  Lighthouse runs per page, default 3; the medians are reported
//
// Each part is a module in scripts/bench/; add a part there and list it below.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureDebianPackage, ensureNodeModules } from './lib/deps.mjs';
import { DATA_DIR, buildWeb } from './lib/env.mjs';
import { runAnalysis } from './bench/analysis.mjs';
import { runBundle } from './bench/bundle.mjs';
import { signIn, startDatabase, startServer } from './bench/environment.mjs';
import { ENDPOINTS, runHttp } from './bench/http.mjs';
import { runImport } from './bench/import.mjs';
import { runLighthouse } from './bench/lighthouse.mjs';
import { options } from './bench/options.mjs';
import { printTable } from './bench/table.mjs';

/**
 * Parts that need the running server, in order. A part with `everyWorkerCount` runs against
 * the server at each BENCH_WORKERS count; the others run once, against the first.
 */
const SERVER_PARTS = [
  {
    name: 'http',
    selected: () => ENDPOINTS.some((endpoint) => options.runs(endpoint.key)),
    everyWorkerCount: true,
    run: (ctx) => runHttp(ctx),
    keep: (results, rows) => results.http.push(...rows),
  },
  {
    name: 'import',
    selected: () => options.runs('import'),
    run: (ctx) => runImport({ base: ctx.server.base, ids: ctx.ids, headers: ctx.headers }),
    keep: (results, value) => (results.import = value),
  },
  {
    name: 'bundle',
    selected: () => options.runs('bundle'),
    needsWebBuild: true,
    run: (ctx) => runBundle({ base: ctx.server.base, webDist: ctx.webDist }),
    keep: (results, value) => (results.bundle = value),
  },
  {
    name: 'lighthouse',
    selected: () => options.runs('lighthouse'),
    needsWebBuild: true,
    run: (ctx) => runLighthouse({ base: ctx.server.base }),
    keep: (results, value) => (results.lighthouse = value),
  },
];

const results = {
  date: new Date().toISOString(),
  // The load average says how busy the machine was: the figures mean little on a busy one.
  machine: { cpus: os.cpus().length, node: process.version, loadAverageAtStart: os.loadavg() },
  settings: {
    duration: options.duration,
    warmup: options.warmup,
    connections: options.connections,
    workers: options.workers,
  },
  http: [],
};

ensureNodeModules();
// Lighthouse drives Debian's Chromium, as the browser tests do.
if (options.runs('lighthouse') && !ensureDebianPackage('/usr/bin/chromium', 'chromium'))
  process.exit(1);
const { default: autocannon } = await import('autocannon');

let stopEverything = async () => {};
process.on('SIGINT', async () => {
  await stopEverything();
  process.exit(130);
});

try {
  if (options.runs('analysis')) results.analysis = runAnalysis();

  const parts = SERVER_PARTS.filter((part) => part.selected());
  if (parts.length > 0) {
    const webDist = parts.some((part) => part.needsWebBuild)
      ? buildWeb(path.join(DATA_DIR, 'bench-web'))
      : null;
    const database = await startDatabase();
    let server = null;
    stopEverything = async () => {
      await server?.stop();
      database.stop();
    };
    try {
      for (const [index, workers] of options.workers.entries()) {
        server = await startServer({ database, workers, webDist, profileDir: options.profileDir });
        const headers = await signIn(server.base);
        const ctx = {
          autocannon,
          options,
          server,
          ids: database.ids,
          headers,
          databaseUrl: database.databaseUrl,
          webDist,
        };
        for (const part of parts) {
          if (index > 0 && !part.everyWorkerCount) continue;
          part.keep(results, await part.run(ctx));
        }
        await server.stop();
        server = null;
        if (options.profileDir) console.log(`CPU profiles written to ${options.profileDir}`);
      }
    } finally {
      await stopEverything();
      stopEverything = async () => {};
    }
  }
} catch (error) {
  console.error(`[bench] ${error.stack ?? error}`);
  process.exitCode = 1;
} finally {
  results.machine.loadAverageAtEnd = os.loadavg();
  if (results.http.length > 0) printSummary(results.http);
  fs.mkdirSync(DATA_DIR, { recursive: true });
  fs.writeFileSync(path.join(DATA_DIR, 'bench-results.json'), JSON.stringify(results, null, 2));
  console.log(`\nresults written to .data/bench-results.json`);
}

function printSummary(rows) {
  console.log(
    `\n== Summary: latency in ms of every answer (50th, 90th, 99th percentile), ${options.duration} s each ==`,
  );
  printTable(
    [
      { title: 'workers asked/running', value: (r) => `${r.workersAsked}/${r.workersRunning}` },
      { title: 'endpoint', value: (r) => r.endpoint, align: 'left' },
      { title: 'load', value: (r) => r.load, align: 'left' },
      { title: 'asked req/s', value: (r) => r.targetRate ?? '-' },
      { title: 'served req/s', value: (r) => r.achievedRate },
      { title: 'p50', value: (r) => r.p50 },
      { title: 'p90', value: (r) => r.p90 },
      { title: 'p99', value: (r) => r.p99 },
      { title: 'p99 target', value: (r) => (r.p99Budget === null ? '-' : `≤ ${r.p99Budget}`) },
      { title: 'errors', value: (r) => r.errors },
      {
        title: 'verdict',
        value: (r) => (r.pass === undefined ? '' : r.pass ? 'ok' : 'MISSES'),
        align: 'left',
      },
    ],
    rows,
  );
  const mismatched = rows.filter((r) => r.workersRunning !== r.workersAsked);
  if (mismatched.length > 0)
    console.log(
      `note: asked for ${[...new Set(mismatched.map((r) => r.workersAsked))].join(', ')} workers but the server ran ${[...new Set(mismatched.map((r) => r.workersRunning))].join(', ')} (it ignores WEB_CONCURRENCY).`,
    );
  const load = (values) => values.map((v) => v.toFixed(1)).join(' ');
  console.log(
    `note: the load generator shares the machine's ${results.machine.cpus} cores with the server and PostgreSQL; load average ${load(results.machine.loadAverageAtStart)} at the start, ${load(results.machine.loadAverageAtEnd)} at the end.`,
  );
  if (rows.some((r) => r.keptUp === false))
    console.log(
      'note: "served" below "asked" means the server fell behind the arrivals: the run is a miss.',
    );
}
