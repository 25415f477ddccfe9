// Settings of `npm run bench`, read once from the environment (see the list in scripts/bench.mjs).

const list = (value) =>
  value
    .split(',')
    .map((s) => s.trim())
    .filter(Boolean);

function positiveInteger(name, fallback) {
  const raw = process.env[name];
  if (raw === undefined || raw === '') return fallback;
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 0) {
    console.error(`[bench] ${name} must be a whole number, got "${raw}"`);
    process.exit(2);
  }
  return value;
}

const only = process.env.BENCH_ONLY ? new Set(list(process.env.BENCH_ONLY)) : null;
const workers = list(process.env.BENCH_WORKERS ?? '2,1').map(Number);
if (workers.length === 0 || workers.some((n) => !Number.isInteger(n) || n < 1)) {
  console.error(`[bench] BENCH_WORKERS must list worker counts such as "2,1"`);
  process.exit(2);
}

export const options = {
  /** Seconds each measurement records. */
  duration: positiveInteger('BENCH_DURATION', 20),
  /** Unrecorded seconds of the same load before each measurement, so the JIT has compiled the path. */
  warmup: positiveInteger('BENCH_WARMUP', 5),
  /** Connections of the closed-loop saturation runs. */
  connections: positiveInteger('BENCH_CONNECTIONS', 50),
  /** Server worker counts to measure (WEB_CONCURRENCY), in order. */
  workers,
  /** Folder for the server's CPU profiles (node --cpu-prof), or null. */
  profileDir: process.env.BENCH_PROFILE || null,
  /** Whether a part (or HTTP endpoint key) runs: every part unless BENCH_ONLY lists some. */
  runs: (part) => !only || only.has(part),
};
