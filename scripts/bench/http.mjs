// Bench part "http": each endpoint at its fixed arrival rate against its p99 budget, then at
// saturation (closed loop), against a running server. BENCH_ONLY keys: site, pooled, patch.
import { fixedRate, saturate } from './load.mjs';

/**
 * The measured endpoints. `rate` (req/s) and `p99Budget` (ms) are the targets of issue 11:
 * a grower's site report, the network's pooled report of a 200-site trial, a strip change.
 */
export const ENDPOINTS = [
  {
    key: 'site',
    name: 'GET /api/sites/:siteId/report',
    rate: 200,
    p99Budget: 50,
    prepare: async ({ base, ids, headers }) => ({
      request: { url: `${base}/api/sites/${ids.siteId}/report`, headers },
    }),
  },
  {
    key: 'pooled',
    name: 'GET /api/trials/:trialId/pooled-report (200 sites)',
    rate: 25,
    p99Budget: 250,
    prepare: async ({ base, ids, headers }) => ({
      request: { url: `${base}/api/trials/${ids.trialId}/pooled-report`, headers },
    }),
  },
  {
    key: 'patch',
    name: 'PATCH /api/strips/:stripId (rotating strips)',
    rate: 100,
    p99Budget: 50,
    // A 409 answers a request that carried a version another request had just replaced: the
    // rotation makes that rare, and it is the API's correct answer, so it is not an error.
    allowedStatuses: [409],
    prepare: prepareStripPatches,
  },
];

/**
 * PATCH requests rotating over the first strip of every block of every site of the bench trial,
 * each carrying the strip's current version (tracked from the answers). `refresh()` rereads the
 * versions, for after a run whose last answers were cut off.
 */
async function prepareStripPatches({ base, ids, headers, databaseUrl }) {
  // Imported here, not at the top: bench.mjs installs the npm packages after its own imports load.
  const { default: pg } = await import('pg');
  const readStrips = async () => {
    const db = new pg.Client({ connectionString: databaseUrl });
    await db.connect();
    try {
      // Plain pg, outside the app: the bench only needs ids and versions to aim its requests.
      const { rows } = await db.query(
        `SELECT st.id, st.version FROM strips st JOIN sites s ON s.id = st.site_id
          WHERE s.trial_id = $1 AND st.position = 1 ORDER BY st.block, s.field_name`,
        [ids.trialId],
      );
      return rows;
    } finally {
      await db.end();
    }
  };
  const strips = await readStrips();
  if (strips.length === 0) throw new Error('no strips to change in the bench trial');
  const versions = new Map(strips.map((s) => [s.id, s.version]));
  let next = 0;
  const keepVersion = (stripId, read) => {
    try {
      versions.set(stripId, read());
    } catch {
      // keep the version we had
    }
  };
  return {
    request: {
      url: base,
      requests: [
        {
          method: 'PATCH',
          headers: { ...headers, 'content-type': 'application/json' },
          setupRequest: (req, context) => {
            const strip = strips[next % strips.length];
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
            if (status === 200) keepVersion(context.stripId, () => JSON.parse(body).version);
            else if (status === 409)
              keepVersion(context.stripId, () => JSON.parse(body).error.current.version);
          },
        },
      ],
    },
    refresh: async () => {
      // Let the server finish requests cut off at the end of the last run, then reread.
      await new Promise((resolve) => setTimeout(resolve, 500));
      for (const row of await readStrips()) versions.set(row.id, row.version);
    },
  };
}

/** Runs every selected endpoint at its fixed rate, then at saturation; returns result rows. */
export async function runHttp({ autocannon, options, server, ids, headers, databaseUrl }) {
  const rows = [];
  const selected = ENDPOINTS.filter((endpoint) => options.runs(endpoint.key));
  const context = { base: server.base, ids, headers, databaseUrl };
  const workers = { workersAsked: server.workersAsked, workersRunning: server.workersRunning };
  const label = `${server.workersAsked} worker${server.workersAsked === 1 ? '' : 's'} asked, ${server.workersRunning} running`;

  // Compute each report once so the first measured request is not the first ever.
  await fetch(`${server.base}/api/sites/${ids.siteId}/report`, { headers });
  await fetch(`${server.base}/api/trials/${ids.trialId}/pooled-report`, { headers });

  console.log(
    `\n== HTTP at a fixed arrival rate (${label}): ${options.warmup} s warm-up, ${options.duration} s measured ==`,
  );
  for (const endpoint of selected) {
    const prepared = await endpoint.prepare(context);
    const shape = { rate: endpoint.rate, request: prepared.request };
    const allowedStatuses = endpoint.allowedStatuses ?? [];
    const result = await fixedRate(autocannon, {
      ...shape,
      warmup: options.warmup,
      duration: options.duration,
      allowedStatuses,
    });
    const row = {
      ...workers,
      endpoint: endpoint.name,
      load: 'fixed rate',
      targetRate: endpoint.rate,
      p99Budget: endpoint.p99Budget,
      ...result,
    };
    // Within target: no errors, p99 within budget, and the server kept up with the arrivals
    // (a server that falls behind delays the next requests, which would hide latency).
    row.keptUp = result.achievedRate >= 0.95 * endpoint.rate;
    row.pass =
      result.errors === 0 && row.keptUp && result.p99 !== null && result.p99 <= endpoint.p99Budget;
    printRow(row);
    rows.push(row);
  }

  console.log(
    `\n== HTTP saturation (${label}): ${options.connections} connections, closed loop, ${options.duration} s ==`,
  );
  for (const endpoint of selected) {
    const prepared = await endpoint.prepare(context);
    const shape = { connections: options.connections, request: prepared.request };
    const allowedStatuses = endpoint.allowedStatuses ?? [];
    if (options.warmup > 0)
      await saturate(autocannon, { ...shape, duration: options.warmup, allowedStatuses });
    await prepared.refresh?.();
    const result = await saturate(autocannon, {
      ...shape,
      duration: options.duration,
      allowedStatuses,
    });
    const row = {
      ...workers,
      endpoint: endpoint.name,
      load: `${options.connections} connections`,
      targetRate: null,
      p99Budget: null,
      ...result,
    };
    printRow(row);
    rows.push(row);
  }
  return rows;
}

function printRow(row) {
  const verdict = row.pass === undefined ? '' : row.pass ? ' — within target' : ' — MISSES target';
  console.log(
    `${row.endpoint}: ${row.achievedRate} req/s${row.targetRate ? ` (asked ${row.targetRate})` : ''}, p50 ${row.p50} ms, p99 ${row.p99} ms, max ${row.max} ms, errors ${row.errors}${verdict}`,
  );
}
