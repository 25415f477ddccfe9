// npm test: install what is missing (npm deps, PostgreSQL, Chromium); on a full run, check
// formatting, lint and types side by side with the web build, then the lint rules' probe test; start a
// throw-away PostgreSQL cluster on 127.0.0.1, migrate and load the demo, run every test with
// vitest, then stop and delete the cluster. Exits non-zero on any failure. `npm test --
// tests/some/path` runs chosen files only and skips the static checks (they cover the whole
// tree, which is not what a chosen run is for).
import fs from 'node:fs';
import path from 'node:path';
import { ensureDebianPackage, ensureNodeModules } from './lib/deps.mjs';
import {
  DATA_DIR,
  buildWeb,
  buildWebAlongside,
  runChild,
  runTs,
  runningChildren,
  stopWhenOrphaned,
} from './lib/env.mjs';
import { freePort, startCluster } from './lib/postgres.mjs';
import {
  ARCHITECTURE_TESTS,
  reportFailedChecks,
  runArchitectureProbes,
  runSideBySideChecks,
} from './lib/static-checks.mjs';

const extraArgs = process.argv.slice(2);
ensureNodeModules();
if (!ensureDebianPackage('/usr/bin/chromium', 'chromium')) process.exit(1);
ensureDebianPackage('/usr/bin/pdfinfo', 'poppler-utils');
const webDist = extraArgs.length === 0 ? await checkAndBuild() : buildWeb();

/**
 * The full run's static checks and the web build, side by side (each check is one thread, the
 * machine has two cores or more); the lint probes last. Exits when any of them fails.
 */
async function checkAndBuild() {
  const build = buildWebAlongside().catch((error) => error);
  const failed = await runSideBySideChecks();
  const built = await build;
  if (built instanceof Error) failed.push('web build (vite build)');
  if (!(await runArchitectureProbes())) failed.push('architecture probes');
  if (failed.length > 0) {
    reportFailedChecks(failed);
    process.exit(1);
  }
  return built;
}

const dataDir = path.join(DATA_DIR, `test-pg-${process.pid}`);
const cluster = await startCluster({
  dataDir,
  port: await freePort(),
  database: 'sheaf_test',
  throwAway: true,
});
let cleaned = false;
function cleanup() {
  if (cleaned) return;
  cleaned = true;
  cluster.stop();
  fs.rmSync(cluster.dataDir, { recursive: true, force: true });
  // A cluster moved to the temporary folder leaves an empty folder behind: remove it too.
  if (path.basename(path.dirname(cluster.dataDir)).startsWith('sheaf-pg-'))
    fs.rmSync(path.dirname(cluster.dataDir), { recursive: true, force: true });
  fs.rmSync(dataDir, { recursive: true, force: true });
  fs.rmSync(`${dataDir}.secrets.json`, { force: true });
  for (const entry of fs.existsSync(DATA_DIR) ? fs.readdirSync(DATA_DIR) : []) {
    if (entry.startsWith('test-uploads-'))
      fs.rmSync(path.join(DATA_DIR, entry), { recursive: true, force: true });
  }
}
function abort(code) {
  for (const child of runningChildren) child.kill('SIGTERM');
  cleanup();
  process.exit(code);
}
process.on('SIGINT', () => abort(130));
process.on('SIGTERM', () => abort(143));
stopWhenOrphaned(() => abort(143));

let code = 1;
try {
  const env = {
    NODE_ENV: 'test',
    // The lowest bcrypt cost for the demo's and the tests' accounts: sign-ins are many.
    BCRYPT_COST: '4',
    WEB_DIST: webDist,
    DATABASE_URL: cluster.databaseUrl,
    SHEAF_TEST_PG_BIN: cluster.bin,
    SHEAF_TEST_PG_DATA: cluster.dataDir,
    SHEAF_TEST_PG_PORT: String(cluster.port),
    SHEAF_TEST_PG_SUPER_URL: cluster.superUrl,
  };
  runTs('db/cli.ts', ['migrate'], env);
  runTs('db/cli.ts', ['seed'], env);
  runTs('api/cli/publish-demo.ts', [], env);
  const vitest = 'node_modules/vitest/vitest.mjs';
  if (extraArgs.length > 0) {
    // A chosen set that includes fault tests runs one file at a time, like the full run.
    const serial = extraArgs.some((arg) => arg.replace(/^\.\//, '').startsWith('tests/faults'))
      ? ['--no-file-parallelism', '--isolate']
      : [];
    code = await runChild(process.execPath, [vitest, 'run', ...serial, ...extraArgs], env);
  } else {
    // Fault tests stop and start PostgreSQL, so they run after everything else, one file at a time.
    // The architecture probes already ran with the static checks.
    code = await runChild(
      process.execPath,
      [vitest, 'run', '--exclude', 'tests/faults/**', '--exclude', `${ARCHITECTURE_TESTS}/**`],
      env,
    );
    const faults = fs.existsSync('tests/faults')
      ? await runChild(
          process.execPath,
          [vitest, 'run', '--no-file-parallelism', '--isolate', 'tests/faults'],
          env,
        )
      : 0;
    code = code || faults;
  }
} catch (error) {
  console.error(`[sheaf] ${error.message}`);
  code = 1;
} finally {
  cleanup();
}
process.exit(code);
