// npm run db:migrate | db:revert | db:seed | db:backup [FILE] | db:restore FILE
// Works on the project cluster in .data/postgres (started for the task when not running).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { ensureNodeModules } from './lib/deps.mjs';
import { DATA_DIR, runTs } from './lib/env.mjs';
import { findPostgresBin, startCluster } from './lib/postgres.mjs';

const [action, fileArg] = process.argv.slice(2);
const actions = ['migrate', 'revert', 'seed', 'backup', 'restore'];
if (!actions.includes(action)) {
  console.error(`usage: node scripts/db.mjs ${actions.join('|')} [FILE]`);
  process.exit(2);
}
ensureNodeModules();
// With DATABASE_URL set, work on that database; otherwise on the project cluster.
const cluster = process.env.DATABASE_URL
  ? {
      bin: findPostgresBin(),
      alreadyRunning: true,
      databaseUrl: process.env.DATABASE_URL,
      stop() {},
    }
  : await startCluster({
      dataDir: process.env.SHEAF_PG_DATA ?? path.join(DATA_DIR, 'postgres'),
      port: Number(process.env.PGPORT ?? 54329),
      database: process.env.SHEAF_DB_NAME ?? 'sheaf',
    });
let code = 0;
try {
  const env = { DATABASE_URL: cluster.databaseUrl };
  if (action === 'migrate' || action === 'revert' || action === 'seed') {
    runTs('db/cli.ts', [action], env);
    if (action === 'seed') runTs('api/cli/publish-demo.ts', [], env);
  } else if (action === 'backup') {
    const file =
      fileArg ??
      path.join(
        DATA_DIR,
        'backups',
        `sheaf-${new Date().toISOString().replace(/[:.]/g, '-')}.dump`,
      );
    fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
    execFileSync(
      path.join(cluster.bin, 'pg_dump'),
      ['--format=custom', '--no-owner', '--file', file, '--dbname', env.DATABASE_URL],
      { stdio: 'inherit' },
    );
    console.log(`[sheaf] backup written to ${file}`);
  } else if (action === 'restore') {
    if (!fileArg || !fs.existsSync(fileArg))
      throw new Error('db:restore needs the path of a backup file written by db:backup');
    const tables = execFileSync(path.join(cluster.bin, 'psql'), [
      '--dbname',
      env.DATABASE_URL,
      '-tAc',
      "SELECT count(*) FROM information_schema.tables WHERE table_schema = 'public'",
    ])
      .toString()
      .trim();
    if (Number(tables) > 0 && !process.env.SHEAF_RESTORE_OVER) {
      throw new Error(
        'db:restore refuses to restore into a database that already has tables; point DATABASE_URL at an empty database',
      );
    }
    execFileSync(
      path.join(cluster.bin, 'pg_restore'),
      [
        '--no-owner',
        '--exit-on-error',
        '--single-transaction',
        '--dbname',
        env.DATABASE_URL,
        fileArg,
      ],
      { stdio: 'inherit' },
    );
    console.log(`[sheaf] restored ${fileArg}`);
  }
} catch (error) {
  console.error(`[sheaf] ${error.message}`);
  code = 1;
} finally {
  if (!cluster.alreadyRunning) cluster.stop();
}
process.exit(code);
