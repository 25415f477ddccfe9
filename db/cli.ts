// Database command line: migrate, revert the last migration, or load the demo scenario.
import 'reflect-metadata';
import { createDataSource } from './data-source';
import { seedDemo } from './seeds/demo';

async function main() {
  const action = process.argv[2];
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is required');
  const dataSource = createDataSource(url, { poolSize: 2 });
  await dataSource.initialize();
  try {
    if (action === 'migrate') {
      const ran = await dataSource.runMigrations({ transaction: 'each' });
      console.log(
        `[sheaf] migrations: ${ran.length === 0 ? 'up to date' : ran.map((m) => m.name).join(', ')}`,
      );
    } else if (action === 'revert') {
      await dataSource.undoLastMigration({ transaction: 'each' });
      console.log('[sheaf] reverted the last migration');
    } else if (action === 'seed') {
      // BCRYPT_COST as the API reads it (api/config/env.ts); tests lower it to sign in faster.
      const passwordCost = process.env.BCRYPT_COST ? Number(process.env.BCRYPT_COST) : undefined;
      const loaded = await seedDemo(dataSource, { passwordCost });
      console.log(
        loaded
          ? '[sheaf] demo scenario loaded (invented data)'
          : '[sheaf] demo scenario already present',
      );
    } else {
      throw new Error(`unknown action "${action}"; use migrate, revert or seed`);
    }
  } finally {
    await dataSource.destroy();
  }
}

main().catch((error) => {
  console.error(`[sheaf] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
