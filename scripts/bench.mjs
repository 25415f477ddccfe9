// npm run bench: analysis timings, an HTTP load test against the real server and a
// throw-away PostgreSQL, a 5,000-row CSV import, and the web bundle sizes a first visit loads.
// BENCH_DURATION (seconds per endpoint, default 20), BENCH_WARMUP (unrecorded seconds before
// each, default 3) and BENCH_CONNECTIONS (default 50).
// BENCH_ONLY=site,pooled,patch,import,bundle,analysis runs only those parts; BENCH_PROFILE=folder
// starts the server with --cpu-prof and leaves its CPU profile there for profiling.
import { spawn, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { ensureNodeModules } from './lib/deps.mjs';
import { DATA_DIR, buildWeb, runTs } from './lib/env.mjs';
import { freePort, startCluster } from './lib/postgres.mjs';

const DURATION = Number(process.env.BENCH_DURATION ?? 20);
// Seconds of unrecorded load before each measurement, so the JIT has compiled the request path.
const WARMUP = Number(process.env.BENCH_WARMUP ?? 3);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const ONLY = process.env.BENCH_ONLY
  ? new Set(process.env.BENCH_ONLY.split(',').map((s) => s.trim()))
  : null;
const runs = (part) => !ONLY || ONLY.has(part);
const PROFILE_DIR = process.env.BENCH_PROFILE ? path.resolve(process.env.BENCH_PROFILE) : null;
const results = {
  date: new Date().toISOString(),
  duration: DURATION,
  warmup: WARMUP,
  connections: CONNECTIONS,
};

ensureNodeModules();
const { default: autocannon } = await import('autocannon');

if (runs('analysis')) {
  console.log('\n== Analysis engine ==');
  const analysis = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench-analysis.ts'], {
    encoding: 'utf8',
  });
  process.stdout.write(analysis.stdout);
  if (analysis.stderr) process.stderr.write(analysis.stderr);
  results.analysis = analysis.stdout.trim();
}

// The analysis bench needs no web build and no database: stop here when it is all that runs.
if (!['site', 'pooled', 'patch', 'import', 'bundle'].some(runs)) {
  fs.mkdirSync(DATA_DIR, { recursive: true });
  fs.writeFileSync(path.join(DATA_DIR, 'bench-results.json'), JSON.stringify(results, null, 2));
  console.log(`\nresults written to .data/bench-results.json`);
  process.exit(0);
}

const webDist = buildWeb(path.join(DATA_DIR, 'bench-web'));
const dataDir = path.join(DATA_DIR, `bench-pg-${process.pid}`);
const cluster = await startCluster({
  dataDir,
  port: await freePort(),
  database: 'sheaf_bench',
  throwAway: true,
});
let server = null;
const cleanup = () => {
  if (server && server.exitCode === null) server.kill('SIGTERM');
  cluster.stop();
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  // A cluster moved to the temporary folder leaves an empty folder behind: remove it too.
  if (path.basename(path.dirname(cluster.dataDir)).startsWith('sheaf-pg-'))
    fs.rmSync(path.dirname(cluster.dataDir), { recursive: true, force: true });
  fs.rmSync(dataDir, { recursive: true, force: true });
  fs.rmSync(`${dataDir}.secrets.json`, { force: true });
};
process.on('SIGINT', () => {
  cleanup();
  process.exit(130);
});

try {
  const env = { DATABASE_URL: cluster.databaseUrl };
  runTs('db/cli.ts', ['migrate'], env);
  runTs('db/cli.ts', ['seed'], env);
  const seeded = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench/large-trial.ts'], {
    encoding: 'utf8',
    env: { ...process.env, ...env },
  });
  if (seeded.status !== 0) throw new Error(`bench seed failed: ${seeded.stderr}`);
  const ids = JSON.parse(seeded.stdout.trim().split('\n').pop());

  const port = await freePort();
  const profileArgs = PROFILE_DIR ? ['--cpu-prof', `--cpu-prof-dir=${PROFILE_DIR}`] : [];
  server = spawn(process.execPath, [...profileArgs, '--import', 'tsx', 'api/server.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_URL: cluster.databaseUrl,
      SESSION_SECRET: 'bench-session-secret-0123456789',
      SMTP_PORT: '0',
      WEB_DIST: webDist,
      UPLOAD_DIR: path.join(dataDir, 'uploads'),
      RATE_LIMIT_LOGIN: '100000',
    },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  await new Promise((resolve, reject) => {
    server.stdout.on('data', (chunk) => chunk.toString().includes('listening on') && resolve());
    server.on('exit', (code) => reject(new Error(`server exited with ${code}`)));
  });
  const base = `http://127.0.0.1:${port}`;

  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const csrfCookie = csrfRes.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const { csrfToken } = await csrfRes.json();
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: csrfCookie, 'x-csrf-token': csrfToken },
    body: JSON.stringify({ email: 'coordinator@millbrook.example', password: 'sheaf-demo' }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status}`);
  const cookie = login.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');
  const headers = { cookie, 'x-csrf-token': csrfToken };

  const summarize = (name, r, allowed = []) => {
    const non2xx = r.non2xx;
    const statusCounts = r.statusCodeStats ?? {};
    const unintended = Object.entries(statusCounts)
      .filter(([code]) => !code.startsWith('2') && !allowed.includes(Number(code)))
      .reduce((n, [, v]) => n + v.count, 0);
    const row = {
      endpoint: name,
      requestsPerSecond: Math.round(r.requests.average),
      p50: r.latency.p50,
      p99: r.latency.p99,
      total: r.requests.total,
      non2xx,
      unintendedErrors: unintended + r.errors + r.timeouts,
      statusCodes: Object.fromEntries(Object.entries(statusCounts).map(([k, v]) => [k, v.count])),
    };
    console.log(
      `${name}: ${row.requestsPerSecond} req/s, p50 ${row.p50} ms, p99 ${row.p99} ms, ${row.total} requests, non-2xx ${non2xx}, unintended errors ${row.unintendedErrors}`,
    );
    return row;
  };
  const load = async (opts, afterWarmup = async () => {}) => {
    if (WARMUP > 0)
      await autocannon({ connections: CONNECTIONS, duration: WARMUP, headers, ...opts });
    await afterWarmup();
    return autocannon({ connections: CONNECTIONS, duration: DURATION, headers, ...opts });
  };

  console.log(`\n== HTTP load: ${CONNECTIONS} connections × ${DURATION} s each ==`);
  results.http = [];
  // Warm both reports once (the engine caches distribution quantiles per process).
  await fetch(`${base}/api/sites/${ids.siteId}/report`, { headers });
  await fetch(`${base}/api/trials/${ids.trialId}/pooled-report`, { headers });
  if (runs('site'))
    results.http.push(
      summarize(
        'GET /api/sites/:siteId/report',
        await load({ url: `${base}/api/sites/${ids.siteId}/report` }),
      ),
    );
  if (runs('pooled'))
    results.http.push(
      summarize(
        'GET /api/trials/:trialId/pooled-report (200 sites)',
        await load({ url: `${base}/api/trials/${ids.trialId}/pooled-report` }),
      ),
    );

  // PATCH: rotate over the first strip of every block of every site, tracking versions.
  const { default: pg } = await import('pg');
  const db = new pg.Client({ connectionString: cluster.databaseUrl });
  await db.connect();
  const listStrips = async () =>
    (
      await db.query(
        `SELECT st.id, st.version FROM strips st JOIN sites s ON s.id = st.site_id
          WHERE s.trial_id = $1 AND st.position = 1 ORDER BY st.block, s.field_name`,
        [ids.trialId],
      )
    ).rows;
  const stripRows = await listStrips();
  if (!runs('patch')) {
    // skipped by BENCH_ONLY
  } else if (stripRows.length > 0) {
    let next = 0;
    const versions = new Map(stripRows.map((s) => [s.id, s.version]));
    const r = await load(
      {
        requests: [
          {
            method: 'PATCH',
            headers: { ...headers, 'content-type': 'application/json' },
            setupRequest: (req, context) => {
              const strip = stripRows[next % stripRows.length];
              next += 1;
              context.stripId = strip.id;
              return {
                ...req,
                path: `/api/strips/${strip.id}`,
                body: JSON.stringify({
                  version: versions.get(strip.id),
                  values: { notes: `bench edit ${next}` },
                }),
              };
            },
            onResponse: (status, body, context) => {
              if (status === 200) {
                try {
                  versions.set(context.stripId, JSON.parse(body).version);
                } catch {
                  /* keep the old version */
                }
              } else if (status === 409) {
                try {
                  versions.set(context.stripId, JSON.parse(body).error.current.version);
                } catch {
                  /* keep */
                }
              }
            },
          },
        ],
        url: base,
      },
      async () => {
        // Requests cut off at the end of the warm-up never reported their new versions: let the
        // server finish them, then read every version afresh.
        await new Promise((resolve) => setTimeout(resolve, 500));
        for (const row of await listStrips()) versions.set(row.id, row.version);
      },
    );
    results.http.push(summarize('PATCH /api/strips/:stripId (rotating)', r, [409]));
  } else {
    console.log('PATCH /api/strips/:stripId: skipped (no strips listed)');
  }
  await db.end();

  const template = runs('import')
    ? await fetch(`${base}/api/sites/${ids.importSiteId}/import-template.csv`, { headers })
    : null;
  if (template) console.log('\n== CSV import of 5,000 rows ==');
  if (!template) {
    // skipped by BENCH_ONLY
  } else if (template.status === 200) {
    const text = await template.text();
    const lines = text.trim().split(/\r?\n/);
    const header = lines[0].split(',');
    const col = (name) => header.indexOf(name);
    const filled = [lines[0]];
    for (const [i, line] of lines.slice(1).entries()) {
      const cells = line.split(',');
      const set = (name, value) => {
        if (col(name) >= 0) cells[col(name)] = String(value);
      };
      set('grain_weight_lb', (4 + (i % 7) * 0.1).toFixed(2));
      set('moisture_pct', '13.5');
      set('harvest_rows', '4');
      set('harvest_length_ft', '50');
      set('stand_1', String(30 + (i % 5)));
      set('stand_row_length_ft', '3');
      filled.push(cells.join(','));
    }
    const form = new FormData();
    form.append('file', new Blob([filled.join('\n')], { type: 'text/csv' }), 'bench.csv');
    const started = performance.now();
    const res = await fetch(`${base}/api/sites/${ids.importSiteId}/import`, {
      method: 'POST',
      headers,
      body: form,
    });
    const ms = performance.now() - started;
    const body = await res.text();
    results.import = { rows: filled.length - 1, status: res.status, milliseconds: Math.round(ms) };
    console.log(
      `import of ${filled.length - 1} rows: HTTP ${res.status} in ${Math.round(ms)} ms${res.status >= 300 ? ` (${body.slice(0, 200)})` : ''}`,
    );
  } else {
    console.log(`import: template route answered ${template.status}; skipped`);
  }

  if (runs('bundle')) {
    console.log('\n== Web bundle: JavaScript a first visit loads (gzip) ==');
    const { chromium } = await import('playwright-core');
    const browser = await chromium.launch({
      executablePath: '/usr/bin/chromium',
      args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking'],
    });
    const measure = async (label, steps) => {
      const page = await browser.newPage();
      const files = new Set();
      page.on('request', (req) => {
        if (req.url().endsWith('.js')) files.add(new URL(req.url()).pathname);
      });
      await steps(page);
      await page.waitForLoadState('networkidle');
      await page.close();
      let raw = 0;
      let gzip = 0;
      for (const file of files) {
        const buf = fs.readFileSync(path.join(webDist, file));
        raw += buf.length;
        gzip += zlib.gzipSync(buf, { level: 9 }).length;
      }
      const row = {
        page: label,
        files: files.size,
        kilobytes: Math.round(raw / 1024),
        gzipKilobytes: Math.round(gzip / 1024),
        loadsCharts: [...files].some((f) => /vega/.test(f)),
      };
      console.log(
        `${label}: ${row.files} files, ${row.kilobytes} kB, ${row.gzipKilobytes} kB gzip, chart chunk loaded: ${row.loadsCharts}`,
      );
      return row;
    };
    results.bundle = [
      await measure('sign-in page', (page) => page.goto(`${base}/sign-in`)),
      await measure('sign-in then grower home', async (page) => {
        await page.goto(`${base}/sign-in`);
        await page.getByLabel(/e-?mail/i).fill('grower1@millbrook.example');
        await page.getByLabel(/password/i).fill('sheaf-demo');
        await page.getByRole('button', { name: /sign in/i }).click();
        await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
      }),
    ];
    await browser.close();
  }
} catch (error) {
  console.error(`[bench] ${error.stack ?? error}`);
  process.exitCode = 1;
} finally {
  fs.mkdirSync(DATA_DIR, { recursive: true });
  fs.writeFileSync(path.join(DATA_DIR, 'bench-results.json'), JSON.stringify(results, null, 2));
  console.log(`\nresults written to .data/bench-results.json`);
  if (PROFILE_DIR && server && server.exitCode === null) {
    // The profile is written as the server exits: wait for it before PostgreSQL stops.
    server.kill('SIGTERM');
    await new Promise((resolve) => server.once('exit', resolve));
    console.log(`CPU profile of the server written to ${PROFILE_DIR}`);
  }
  cleanup();
}
