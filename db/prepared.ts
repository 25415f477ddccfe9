// Named prepared statements through TypeORM: PostgreSQL parses and plans a named statement once
// per connection and reuses the plan, which halved PostgreSQL's CPU per strip change (planning a
// five-part WITH statement cost more than running it). TypeORM's query() hands its first
// argument to node-postgres unchanged, and node-postgres accepts a { name, text } config there;
// the cast below is the only place that relies on it. Use it for fixed SQL texts on hot paths
// only: every distinct text becomes one statement kept by every pooled connection.
import type { DataSource, EntityManager } from 'typeorm';

type Queryable = Pick<DataSource | EntityManager, 'query'>;

const names = new Map<string, string>();

/** The statement name for a SQL text: stable within the process, distinct per text. */
export function statementName(sql: string): string {
  let name = names.get(sql);
  if (name === undefined) {
    name = `sheaf_${names.size + 1}`;
    names.set(sql, name);
  }
  return name;
}

/** Runs `sql` as a named prepared statement; same result shape as `db.query(sql, params)`. */
export function preparedQuery<T = Record<string, unknown>>(
  db: Queryable,
  sql: string,
  params: unknown[],
): Promise<T[]> {
  const config = { name: statementName(sql), text: sql };
  return db.query(config as unknown as string, params);
}
