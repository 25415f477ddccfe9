// Load shapes for the HTTP bench, on autocannon: a fixed arrival rate (open loop) and
// saturation (closed loop: N connections, each sending its next request when the last answers).
//
// autocannon's `overallRate` lets each connection send its share of the rate at the start of
// every second, so one instance sends its whole second's requests in one burst. To arrive
// evenly, the rate is split over up to 50 instances of 1 request per connection per second,
// started 1000/slices ms apart: at 200 req/s, 4 requests every 20 ms. A connection waits for
// its answer only once a second, so the schedule holds unless an answer takes over a second.
// Latency is recorded from each response (autocannon's own "coordinated omission" correction is
// off: with a per-connection rate it adds made-up samples at 1 ms steps).
//
// The warm-up is the first seconds of the same run: the arrivals never pause or restart between
// warm-up and measurement (a restart starts 50 load generators at once, and the first seconds
// after it measured the load generator), and only requests sent after the warm-up are recorded.

const MAX_SLICES = 50;
const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

function collector(allowedStatuses) {
  const latencies = [];
  const statusCodes = {};
  return {
    record(status, ms) {
      statusCodes[status] = (statusCodes[status] ?? 0) + 1;
      latencies.push(ms);
    },
    summary({ duration, errors, timeouts }) {
      latencies.sort((a, b) => a - b);
      // Nearest-rank percentile of every recorded answer.
      const at = (p) =>
        latencies.length === 0
          ? null
          : round(latencies[Math.max(0, Math.ceil((p / 100) * latencies.length) - 1)]);
      const unexpected = Object.entries(statusCodes)
        .filter(([code]) => !code.startsWith('2') && !allowedStatuses.includes(Number(code)))
        .reduce((n, [, count]) => n + count, 0);
      return {
        requests: latencies.length,
        achievedRate: round(latencies.length / duration),
        p50: at(50),
        p90: at(90),
        p99: at(99),
        max: at(100),
        statusCodes,
        errors: unexpected + errors + timeouts,
      };
    },
  };
}

const round = (value) => Math.round(value * 10) / 10;

/**
 * `rate` requests per second for `warmup` + `duration` seconds, arriving evenly (see the file
 * comment); only requests sent after the warm-up are recorded.
 */
export async function fixedRate(
  autocannon,
  { rate, duration, warmup = 0, request, allowedStatuses = [] },
) {
  const slices = Math.min(rate, MAX_SLICES);
  const spacing = 1000 / slices;
  const results = collector(allowedStatuses);
  const trackers = [];
  const started = performance.now();
  const recordFrom = started + warmup * 1000;
  for (let i = 0; i < slices; i++) {
    const sliceRate = Math.floor(rate / slices) + (i < rate % slices ? 1 : 0);
    const wait = started + i * spacing - performance.now();
    if (wait > 0) await sleep(wait);
    const tracker = autocannon({
      ...request,
      connections: sliceRate,
      overallRate: sliceRate,
      duration: warmup + duration,
      ignoreCoordinatedOmission: true,
      timeout: 10,
    });
    tracker.on('response', (_client, status, _bytes, ms) => {
      if (performance.now() - ms >= recordFrom) results.record(status, ms);
    });
    trackers.push(tracker);
  }
  const finished = await Promise.all(trackers);
  // autocannon counts errors and timeouts over the whole run, warm-up included.
  return results.summary({
    duration,
    errors: finished.reduce((n, r) => n + r.errors - r.timeouts, 0),
    timeouts: finished.reduce((n, r) => n + r.timeouts, 0),
  });
}

/** Closed loop: `connections` connections as fast as the server answers, for `duration` seconds. */
export async function saturate(
  autocannon,
  { connections, duration, request, allowedStatuses = [] },
) {
  const results = collector(allowedStatuses);
  const tracker = autocannon({ ...request, connections, duration, timeout: 10 });
  tracker.on('response', (_client, status, _bytes, ms) => results.record(status, ms));
  const finished = await tracker;
  return results.summary({
    duration,
    errors: finished.errors - finished.timeouts,
    timeouts: finished.timeouts,
  });
}
