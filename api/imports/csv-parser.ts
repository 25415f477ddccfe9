// Parses CSV imports in one worker thread per process, so a large or bad file does not stall
// other requests; a parse that runs too long is stopped and the worker replaced.
import { Worker } from 'node:worker_threads';
import type { ImportContext, ParsedImport } from '../../shared/import/parse-import';
import { AppError } from '../errors';

const PARSE_TIMEOUT_MS = 20_000;

interface Pending {
  resolve: (result: ParsedImport) => void;
  reject: (error: Error) => void;
  timer: NodeJS.Timeout;
}

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

function failAll(error: Error) {
  for (const [id, job] of pending) {
    clearTimeout(job.timer);
    job.reject(error);
    pending.delete(id);
  }
}

function getWorker(): Worker {
  if (worker) return worker;
  // The worker is TypeScript: its entry registers tsx first, however this process was started.
  const created = new Worker(new URL('./parse-worker-entry.mjs', import.meta.url));
  created.unref();
  created.on('message', (message: { id: number; result?: ParsedImport; error?: string }) => {
    const job = pending.get(message.id);
    if (!job) return;
    pending.delete(message.id);
    clearTimeout(job.timer);
    if (message.result) job.resolve(message.result);
    else job.reject(new Error(message.error ?? 'CSV parse failed'));
  });
  const drop = (error: Error) => {
    if (worker === created) worker = null;
    failAll(error);
  };
  created.on('error', drop);
  created.on('exit', (code) => drop(new Error(`CSV parser stopped (${code})`)));
  worker = created;
  return created;
}

/** parseImportCsv in the worker thread. */
export function parseImportInWorker(text: string, context: ImportContext): Promise<ParsedImport> {
  return new Promise((resolve, reject) => {
    const id = nextId++;
    const current = getWorker();
    const timer = setTimeout(() => {
      pending.delete(id);
      reject(
        new AppError(
          422,
          'invalid_rows',
          'This file took too long to read; split it or start from the template',
        ),
      );
      // The worker may be stuck on this file: replace it (others in flight fail and can retry).
      void current.terminate();
    }, PARSE_TIMEOUT_MS);
    pending.set(id, { resolve, reject, timer });
    current.ref();
    current.postMessage({ id, text, context: { ...context, strips: [...context.strips] } });
  }).finally(() => {
    if (pending.size === 0) worker?.unref();
  }) as Promise<ParsedImport>;
}
