// Idempotency-Key for creating requests: the first request with a key runs and its answer is
// kept in PostgreSQL for 24 hours; repeats (also parallel ones, from any worker process) get
// that same answer instead of making another record.
import crypto from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { LessThan, type DataSource } from 'typeorm';
import { IdempotencyKey } from '../../db/entities/idempotency-key.entity';
import { AppError, ValidationError } from '../errors';

export const IDEMPOTENCY_HEADER = 'Idempotency-Key';
const KEEP_MS = 24 * 60 * 60 * 1000;
const WAIT_FOR_FIRST_MS = 30_000;
const KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,200}$/;

function requestHash(req: Request): string {
  // Multipart bodies are read later by the route; the key then covers method and path only.
  const body = req.is('multipart/form-data') ? '' : JSON.stringify(req.body ?? null);
  return crypto
    .createHash('sha256')
    .update(`${req.method} ${req.originalUrl}\n${body}`)
    .digest('hex');
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export function idempotency(dataSource: DataSource): RequestHandler {
  const keys = dataSource.getRepository(IdempotencyKey);
  return async (req, res, next) => {
    const key = req.get(IDEMPOTENCY_HEADER);
    // Sign-in and sign-out answers set cookies, which a stored answer would not repeat.
    if (!key || req.method !== 'POST' || req.path.startsWith('/auth/')) return next();
    if (!KEY_PATTERN.test(key))
      return next(
        new ValidationError('The Idempotency-Key header is not valid', {
          [IDEMPOTENCY_HEADER]: '8–200 letters, digits, or - _ . :',
        }),
      );
    const scope = req.user ? `user:${req.user.id}` : `anonymous:${req.sessionID ?? ''}`;
    const hash = requestHash(req);
    const expiredBefore = new Date(Date.now() - KEEP_MS);
    await keys.delete({ scope, key, createdAt: LessThan(expiredBefore) });
    const inserted = await keys
      .createQueryBuilder()
      .insert()
      .values({ scope, key, method: req.method, path: req.originalUrl, requestHash: hash })
      .orIgnore()
      .returning('key')
      .execute();
    if ((inserted.raw as unknown[]).length > 0) {
      recordAnswer(res, async (answer) => {
        if (answer === null || answer.status >= 500) await keys.delete({ scope, key });
        else
          await keys.update(
            { scope, key },
            { status: answer.status, contentType: answer.contentType, body: answer.body },
          );
      });
      return next();
    }
    // Someone sent this key first: wait for their answer and repeat it.
    const deadline = Date.now() + WAIT_FOR_FIRST_MS;
    for (;;) {
      const first = await keys.findOneBy({ scope, key });
      if (!first)
        return next(
          new AppError(
            409,
            'conflict',
            'The first request with this key failed; send again with a new key',
          ),
        );
      if (first.requestHash !== hash)
        return next(
          new AppError(
            422,
            'validation_failed',
            'This Idempotency-Key was used for a different request',
            {
              fields: { [IDEMPOTENCY_HEADER]: 'already used for a different request' },
            },
          ),
        );
      if (first.status !== null) {
        res.status(first.status);
        res.set('Idempotent-Replayed', 'true');
        if (first.contentType) res.set('Content-Type', first.contentType);
        res.end(first.body ?? undefined);
        return;
      }
      if (Date.now() > deadline)
        return next(
          new AppError(409, 'conflict', 'The first request with this key is still running'),
        );
      await sleep(50);
    }
  };
}

/** Collects the response body and calls `done` once it is sent (null if the client went away). */
function recordAnswer(
  res: Parameters<RequestHandler>[1],
  done: (
    answer: { status: number; contentType: string | null; body: Buffer } | null,
  ) => Promise<void>,
) {
  const chunks: Buffer[] = [];
  const write = res.write.bind(res) as (...args: unknown[]) => boolean;
  const end = res.end.bind(res) as (...args: unknown[]) => typeof res;
  const keep = (chunk: unknown, encoding: unknown) => {
    if (chunk === undefined || chunk === null || typeof chunk === 'function') return;
    chunks.push(
      Buffer.isBuffer(chunk)
        ? chunk
        : Buffer.from(
            chunk as string,
            typeof encoding === 'string' ? (encoding as BufferEncoding) : 'utf8',
          ),
    );
  };
  (res as { write: unknown }).write = (chunk: unknown, encoding?: unknown, ...rest: unknown[]) => {
    keep(chunk, encoding);
    return write(chunk, encoding, ...rest);
  };
  (res as { end: unknown }).end = (chunk?: unknown, encoding?: unknown, ...rest: unknown[]) => {
    keep(chunk, encoding);
    return end(chunk, encoding, ...rest);
  };
  let settled = false;
  const settle = (answer: Parameters<typeof done>[0]) => {
    if (settled) return;
    settled = true;
    done(answer).catch((error: unknown) =>
      console.error(`[sheaf] could not store an idempotent answer: ${(error as Error).message}`),
    );
  };
  res.on('finish', () =>
    settle({
      status: res.statusCode,
      contentType: (res.getHeader('Content-Type') as string | undefined) ?? null,
      body: Buffer.concat(chunks),
    }),
  );
  res.on('close', () => settle(null));
}
