// A process-wide counter of data changes, so read caches can tell "nothing was written since I
// computed this" without asking PostgreSQL. A TypeORM subscriber sees every statement this
// process sends through any DataSource and moves the counter before a write, after it, and again
// when its transaction ends (a write inside a transaction is only visible after COMMIT).
// Sessions go through their own pool and are not counted: no cached read depends on them.
import {
  EventSubscriber,
  type AfterQueryEvent,
  type BeforeQueryEvent,
  type EntitySubscriberInterface,
} from 'typeorm';

let generation = 0;

/** The current data generation; any write by this process moves it. */
export function dataGeneration(): number {
  return generation;
}

/** Marks that data may have changed (also for writes made outside TypeORM). */
export function noteDataChange(): void {
  generation += 1;
}

const READ_ONLY =
  /^\s*(SELECT|WITH|SHOW|BEGIN|START TRANSACTION|COMMIT|ROLLBACK|SET|SAVEPOINT|RELEASE|EXPLAIN)\b/i;
/** Each statement is classified once: the subscriber asks before and after every query. */
const verdicts = new Map<string, boolean>();
const WRITE_WORD =
  /\b(INSERT|UPDATE|DELETE|TRUNCATE|MERGE|COPY|CREATE|ALTER|DROP|nextval|setval|pg_notify)\b/i;

/**
 * Whether a statement may change data. Errs towards "yes": a false yes only costs a cache miss,
 * a false no would serve stale data. Row locks (FOR UPDATE) are reads.
 */
export function mayWrite(query: string | { text: string }): boolean {
  // db/prepared.ts passes node-postgres query configs through TypeORM.
  const sql = typeof query === 'string' ? query : query.text;
  let answer = verdicts.get(sql);
  if (answer === undefined) {
    answer =
      !READ_ONLY.test(sql) || WRITE_WORD.test(sql.replace(/\bFOR\s+(NO\s+KEY\s+)?UPDATE\b/gi, ''));
    // The SQL texts are the program's own, so few; the cap only guards against a runaway.
    if (verdicts.size >= 5000) verdicts.clear();
    verdicts.set(sql, answer);
  }
  return answer;
}

@EventSubscriber()
export class DataChangeSubscriber implements EntitySubscriberInterface {
  beforeQuery(event: BeforeQueryEvent): void {
    if (mayWrite(event.query)) noteDataChange();
  }

  afterQuery(event: AfterQueryEvent): void {
    if (mayWrite(event.query)) noteDataChange();
  }

  afterTransactionCommit(): void {
    noteDataChange();
  }

  afterTransactionRollback(): void {
    noteDataChange();
  }
}
