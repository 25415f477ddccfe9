// The static checks `npm test` runs before any test: formatting, lint (with the architecture
// rules), types, and the probe test that shows the architecture rules refuse what they should.
// Each runs even when an earlier one failed, so one run lists every problem.
import { spawnSync } from 'node:child_process';

/** The probe tests of the lint rules; the full run's main vitest pass leaves them out. */
export const ARCHITECTURE_TESTS = 'tests/lint';

const CHECKS = [
  {
    name: 'formatting (prettier --check .)',
    args: ['node_modules/prettier/bin/prettier.cjs', '--check', '--log-level', 'warn', '.'],
  },
  { name: 'lint (eslint .)', args: ['node_modules/eslint/bin/eslint.js', '.'] },
  {
    name: 'types (tsc --noEmit)',
    args: ['node_modules/typescript/bin/tsc', '--noEmit', '-p', 'tsconfig.json'],
  },
  {
    // It writes probe files into api/, web/, shared/ and db/ for a few seconds, so it runs here,
    // alone, not beside the tests that read every file under api/.
    name: `architecture probes (vitest run ${ARCHITECTURE_TESTS})`,
    args: ['node_modules/vitest/vitest.mjs', 'run', ARCHITECTURE_TESTS],
  },
];

/** Runs every check with its output shown; returns true when all pass. */
export function runStaticChecks() {
  const failed = [];
  for (const check of CHECKS) {
    console.log(`[sheaf] checking ${check.name}…`);
    const started = Date.now();
    const result = spawnSync(process.execPath, check.args, { stdio: 'inherit' });
    const seconds = ((Date.now() - started) / 1000).toFixed(1);
    if (result.status === 0) console.log(`[sheaf] ${check.name}: ok (${seconds} s)`);
    else failed.push(check.name);
  }
  if (failed.length > 0) {
    console.error(`[sheaf] static checks failed: ${failed.join('; ')}.`);
    console.error(
      '[sheaf] fix them (npm run format, npm run lint, npm run typecheck) and run npm test again.',
    );
  }
  return failed.length === 0;
}
