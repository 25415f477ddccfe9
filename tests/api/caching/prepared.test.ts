// Named prepared statements through TypeORM (db/prepared.ts): PostgreSQL keeps the statement on
// the connection, answers like a plain query, and writes through it still count as writes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { dataGeneration } from '../../../db/data-changes';
import { preparedQuery, statementName } from '../../../db/prepared';
import { createTestApp, type TestApp } from '../../helpers/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => {
  await t.close();
});

describe('prepared statements', () => {
  it('gives one name per SQL text', () => {
    expect(statementName('SELECT 1 AS a')).toBe(statementName('SELECT 1 AS a'));
    expect(statementName('SELECT 1 AS a')).not.toBe(statementName('SELECT 2 AS a'));
  });

  it('is kept by PostgreSQL on the connection and answers like a plain query', async () => {
    const sql = 'SELECT $1::int + 1 AS next, $2::text AS word';
    const runner = t.dataSource.createQueryRunner();
    await runner.connect();
    try {
      const plain = await runner.query(sql, [41, 'wheat']);
      const first = await preparedQuery(runner.manager, sql, [41, 'wheat']);
      const second = await preparedQuery(runner.manager, sql, [1, 'oats']);
      expect(first).toEqual(plain);
      expect(second).toEqual([{ next: 2, word: 'oats' }]);
      const kept = await runner.query(
        'SELECT name, statement FROM pg_prepared_statements WHERE name = $1',
        [statementName(sql)],
      );
      expect(kept).toEqual([{ name: statementName(sql), statement: sql }]);
    } finally {
      await runner.release();
    }
  });

  it('counts a write made through a prepared statement', async () => {
    const before = dataGeneration();
    await preparedQuery(
      t.dataSource,
      "UPDATE networks SET name = name WHERE id = '00000000-0000-0000-0000-000000000000'",
      [],
    );
    expect(dataGeneration()).toBeGreaterThan(before);
    const read = dataGeneration();
    await preparedQuery(t.dataSource, 'SELECT 1 AS one', []);
    expect(dataGeneration()).toBe(read);
  });
});
