// Reads the environment and listens. With WEB_CONCURRENCY=N above 1 a primary process forks N
// workers (Node's cluster module) that share PORT; every worker is the same stateless app
// (api/worker.ts), since PostgreSQL holds all shared state. SIGTERM/SIGINT finish in-flight
// requests and close everything.
import cluster from 'node:cluster';
import { readConfig, type AppConfig } from './config/env';

/** The cluster primary: forks the workers, replaces one that crashes, stops them all on a signal. */
function supervise(config: AppConfig) {
  const count = config.WEB_CONCURRENCY;
  let listening = 0;
  let stopping = false;
  let port = config.PORT;
  const fork = () => cluster.fork();
  cluster.on('message', (_worker, message: { listening?: number }) => {
    if (typeof message?.listening !== 'number') return;
    port = message.listening;
    listening += 1;
    if (listening === count)
      console.log(`[sheaf] listening on http://${config.HOST}:${port} (${count} workers)`);
  });
  cluster.on('exit', (worker, code, signal) => {
    if (stopping || code === 0) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(0);
      return;
    }
    console.error(
      `[sheaf] worker ${worker.process.pid} stopped (${signal ?? code}); starting another`,
    );
    setTimeout(fork, 500);
  });
  const stop = (signal: NodeJS.Signals) => {
    if (stopping) return;
    stopping = true;
    console.log(`[sheaf] ${signal}: finishing requests and shutting down`);
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill('SIGTERM');
    setTimeout(() => process.exit(1), 12_000).unref();
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
  for (let i = 0; i < count; i += 1) fork();
}

async function main() {
  const config = readConfig();
  if (config.WEB_CONCURRENCY > 1 && cluster.isPrimary) {
    supervise(config);
    return;
  }
  const worker = cluster.isWorker;
  // Loaded here, not at the top: the primary forks workers and never needs the app.
  const { serve } = await import('./worker');
  return serve(config, (port) => {
    if (worker) process.send?.({ listening: port });
    else console.log(`[sheaf] listening on http://${config.HOST}:${port}`);
  });
}

Promise.resolve()
  .then(main)
  .catch((error) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
