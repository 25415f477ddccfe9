// Bench part "analysis": times the pure analysis engine; needs no database and no web build.
import { spawnSync } from 'node:child_process';

export function runAnalysis() {
  console.log('\n== Analysis engine ==');
  const analysis = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/bench-analysis.ts'], {
    encoding: 'utf8',
  });
  process.stdout.write(analysis.stdout);
  if (analysis.status !== 0) throw new Error(`analysis bench failed: ${analysis.stderr}`);
  return analysis.stdout.trim();
}
