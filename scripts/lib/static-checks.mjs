// The static checks `npm test` runs before any test: formatting, lint (with the architecture
// rules), types, and the probe test that shows the architecture rules refuse what they should.
// Each runs even when another failed, so one run lists every problem. Formatting, lint and
// types run side by side (each is one thread); the probes run after them, alone.
import { runQuietly } from './env.mjs';

/** The probe tests of the lint rules; the full run's main vitest pass leaves them out. */
export const ARCHITECTURE_TESTS = 'tests/lint';

const SIDE_BY_SIDE = [
  {
    name: 'formatting (prettier --check .)',
    args: ['node_modules/prettier/bin/prettier.cjs', '--check', '--log-level', 'warn', '.'],
  },
  { name: 'lint (eslint .)', args: ['node_modules/eslint/bin/eslint.js', '.'] },
  {
    name: 'types (tsc --noEmit)',
    args: ['node_modules/typescript/bin/tsc', '--noEmit', '-p', 'tsconfig.json'],
  },
];

// It writes probe files into api/, web/, shared/ and db/ for a few seconds, so it runs after
// lint (which would read them) and alone, not beside the tests that read every file under api/.
const PROBES = {
  name: `architecture probes (vitest run ${ARCHITECTURE_TESTS})`,
  args: ['node_modules/vitest/vitest.mjs', 'run', ARCHITECTURE_TESTS],
};

/** Runs formatting, lint and types side by side; resolves with the names of those that failed. */
export async function runSideBySideChecks() {
  const results = await Promise.all(
    SIDE_BY_SIDE.map((check) => runQuietly(`checking ${check.name}`, process.execPath, check.args)),
  );
  return SIDE_BY_SIDE.filter((_, i) => results[i].code !== 0).map((check) => check.name);
}

/** The probes, once lint and the web build (whose CSS step reads web/) are done; true when they pass. */
export async function runArchitectureProbes() {
  const probes = await runQuietly(`checking ${PROBES.name}`, process.execPath, PROBES.args);
  return probes.code === 0;
}

/** Says which static checks failed and how to fix them. */
export function reportFailedChecks(failed) {
  console.error(`[sheaf] static checks failed: ${failed.join('; ')}.`);
  console.error(
    '[sheaf] fix them (npm run format, npm run lint, npm run typecheck) and run npm test again.',
  );
}
