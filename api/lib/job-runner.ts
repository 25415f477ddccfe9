// A small job queue in PostgreSQL: requests enqueue work, and every worker process polls and
// claims jobs with SELECT … FOR UPDATE SKIP LOCKED, so each job runs once across processes.
import { LessThan, type DataSource, type EntityManager } from 'typeorm';
import { Job } from '../../db/entities/job.entity';

export type JobHandler = (payload: Record<string, unknown>) => Promise<void>;
export type JobHandlers = Record<string, JobHandler>;

const LEASE_MS = 60_000;
const MAX_ATTEMPTS = 5;
const KEEP_DONE_MS = 24 * 60 * 60 * 1000;

export async function enqueueJob(
  manager: EntityManager,
  queue: string,
  kind: string,
  payload: Record<string, unknown>,
): Promise<void> {
  const job = Object.assign(new Job(), { queue, kind, payload });
  await manager.getRepository(Job).save(job);
}

export interface JobRunner {
  /** Looks for work now instead of at the next poll. */
  poke(): void;
  /** Claims and runs waiting jobs until none is left; returns how many ran. */
  drain(): Promise<number>;
  stop(): Promise<void>;
}

export function startJobRunner(
  dataSource: DataSource,
  handlers: JobHandlers,
  options: { queue?: string; pollMs?: number } = {},
): JobRunner {
  const queue = options.queue ?? 'default';
  const pollMs = options.pollMs ?? 1000;
  const jobs = dataSource.getRepository(Job);
  let stopped = false;
  let timer: NodeJS.Timeout | null = null;
  let running: Promise<number> | null = null;

  /** Takes a lease on the oldest due job that no other worker holds. */
  async function claim(): Promise<Job | null> {
    return dataSource.transaction(async (manager) => {
      const job = await manager
        .getRepository(Job)
        .createQueryBuilder('job')
        .where('job.queue = :queue', { queue })
        .andWhere('job.done_at IS NULL')
        .andWhere('job.run_at <= now()')
        .andWhere('(job.locked_until IS NULL OR job.locked_until < now())')
        .orderBy('job.run_at', 'ASC')
        .limit(1)
        .setLock('pessimistic_write')
        .setOnLocked('skip_locked')
        .getOne();
      if (!job) return null;
      job.attempts += 1;
      job.lockedUntil = new Date(Date.now() + LEASE_MS);
      await manager.getRepository(Job).update(job.id, {
        attempts: job.attempts,
        lockedUntil: job.lockedUntil,
      });
      return job;
    });
  }

  async function runOne(job: Job): Promise<void> {
    const handler = handlers[job.kind];
    try {
      if (!handler) throw new Error(`no handler for job kind ${job.kind}`);
      await handler(job.payload);
      await jobs.update(job.id, { doneAt: new Date(), lockedUntil: null, lastError: null });
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const giveUp = job.attempts >= MAX_ATTEMPTS;
      if (giveUp) console.error(`[sheaf] job ${job.kind} ${job.id} failed for good: ${message}`);
      await jobs.update(job.id, {
        lastError: message.slice(0, 1000),
        lockedUntil: null,
        doneAt: giveUp ? new Date() : null,
        // Back off 2, 4, 8… seconds.
        runAt: new Date(Date.now() + 1000 * 2 ** job.attempts),
      });
    }
  }

  async function drainOnce(): Promise<number> {
    let ran = 0;
    for (;;) {
      if (stopped) return ran;
      const job = await claim();
      if (!job) break;
      await runOne(job);
      ran += 1;
    }
    // Finished jobs are kept a day for operators; clearing them now and then is enough.
    if (ran > 0 || Math.random() < 0.01)
      await jobs.delete({ doneAt: LessThan(new Date(Date.now() - KEEP_DONE_MS)), queue });
    return ran;
  }

  function drain(): Promise<number> {
    running ??= drainOnce().finally(() => {
      running = null;
    });
    return running;
  }

  function schedule(delay: number) {
    if (stopped) return;
    if (timer) clearTimeout(timer);
    timer = setTimeout(() => {
      timer = null;
      drain()
        .catch((error: unknown) => {
          // PostgreSQL down: try again at the next poll.
          if (!stopped) console.error(`[sheaf] job queue: ${(error as Error).message}`);
        })
        .finally(() => schedule(pollMs));
    }, delay);
    timer.unref();
  }
  schedule(0);

  return {
    poke: () => schedule(0),
    drain,
    async stop() {
      stopped = true;
      if (timer) clearTimeout(timer);
      await running?.catch(() => undefined);
    },
  };
}
