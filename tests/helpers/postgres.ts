// Stops and starts the throw-away test cluster (fault tests only; they run after the rest).
import { execFileSync } from 'node:child_process';
import path from 'node:path';

function pgCtl(args: string[]) {
  const bin = process.env.SHEAF_TEST_PG_BIN;
  const dataDir = process.env.SHEAF_TEST_PG_DATA;
  if (!bin || !dataDir)
    throw new Error('SHEAF_TEST_PG_BIN/DATA are not set: run through `npm test`');
  const exe = path.join(bin, 'pg_ctl');
  const full = ['-D', dataDir, ...args];
  if (process.getuid?.() === 0)
    execFileSync('runuser', ['-u', 'postgres', '--', exe, ...full], { stdio: 'pipe' });
  else execFileSync(exe, full, { stdio: 'pipe' });
}

export function stopTestCluster() {
  pgCtl(['-m', 'fast', '-w', 'stop']);
}

export function startTestCluster() {
  const dataDir = process.env.SHEAF_TEST_PG_DATA!;
  pgCtl([
    '-l',
    path.join(dataDir, 'server.log'),
    '-w',
    '-t',
    '60',
    '-o',
    `-p ${process.env.SHEAF_TEST_PG_PORT}`,
    'start',
  ]);
}
