// TypeORM DataSource for PostgreSQL; schema changes only through migrations.
import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { ENTITIES } from './entities/index';
import { InitialSchema1764633600000 } from './migrations/1764633600000-initial-schema';
import { RateLimitHits1765000000000 } from './migrations/1765000000000-rate-limit-hits';
import { SecurityTables1765100000000 } from './migrations/1765100000000-security-tables';
import { TrialSeries1765200000000 } from './migrations/1765200000000-trial-series';
import { NetworksAndTrialLife1765400000000 } from './migrations/1765400000000-networks-and-trial-life';

export function createDataSource(
  databaseUrl: string,
  options: { poolSize?: number } = {},
): DataSource {
  return new DataSource({
    type: 'postgres',
    url: databaseUrl,
    entities: ENTITIES,
    migrations: [
      InitialSchema1764633600000,
      RateLimitHits1765000000000,
      SecurityTables1765100000000,
      TrialSeries1765200000000,
      NetworksAndTrialLife1765400000000,
    ],
    synchronize: false,
    migrationsRun: false,
    uuidExtension: 'pgcrypto',
    logging: ['error'],
    extra: {
      max: options.poolSize ?? 10,
      // Fail fast when PostgreSQL is down instead of queueing requests forever.
      connectionTimeoutMillis: 2000,
      idleTimeoutMillis: 10_000,
      statement_timeout: 30_000,
    },
  });
}
