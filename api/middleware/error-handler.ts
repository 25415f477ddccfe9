// The only place that writes error JSON: { error: { code, message, fields?, rows? } }.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { AppError, Busy } from '../errors';

/** Turns a zod issue path into the dotted field name the client shows the message beside. */
function fieldName(path: readonly PropertyKey[]): string {
  return path.length === 0 ? '_' : path.map(String).join('.');
}

export function zodToFields(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = fieldName(issue.path);
    if (!(key in fields)) fields[key] = issue.message;
  }
  return fields;
}

function isDatabaseDown(error: unknown): boolean {
  const e = error as { code?: string; message?: string; driverError?: { code?: string } } | null;
  const code = e?.code ?? e?.driverError?.code;
  if (code && ['ECONNREFUSED', 'ECONNRESET', '57P01', '57P03', 'ETIMEDOUT', 'EPIPE'].includes(code))
    return true;
  const message = e?.message ?? '';
  return /Connection terminated|timeout exceeded when trying to connect|connect ECONNREFUSED|Client has encountered a connection error|the database system is (shutting down|starting up)/i.test(
    message,
  );
}

/**
 * Errors from reading the request body (body-parser, zlib) and PostgreSQL's refusals of text
 * or dates, as 4xx answers naming the header or field at fault.
 */
function bodyReadingError(
  err: unknown,
  status: number | undefined,
): { status: number; error: Record<string, unknown> } | null {
  const e = err as { type?: string; code?: string; expose?: boolean; message?: string };
  if (e.type === 'charset.unsupported')
    return {
      status: 415,
      error: {
        code: 'unsupported_media_type',
        message: 'Send JSON encoded as UTF-8',
        fields: { 'Content-Type': 'Use charset=utf-8 (or leave the charset out)' },
      },
    };
  if (e.type === 'encoding.unsupported' || (status === 400 && /^Z_|^ERR__ERROR/.test(e.code ?? '')))
    return {
      status: 415,
      error: {
        code: 'unsupported_media_type',
        message: 'The body is not encoded as its Content-Encoding header says',
        fields: { 'Content-Encoding': 'Send the body as it is, or really compressed with gzip' },
      },
    };
  if (e.code && ['22021', '22P05', '22008', '22007', '22P02'].includes(e.code))
    return {
      status: 400,
      error: {
        code: 'validation_failed',
        message: 'A value in the request cannot be stored as it is',
        fields: { _: 'invalid text, number or date' },
      },
    };
  if (
    status !== undefined &&
    status >= 400 &&
    status < 500 &&
    e.expose &&
    e.type !== 'entity.parse.failed' &&
    status !== 413
  )
    return {
      status,
      error: {
        code: status === 415 ? 'unsupported_media_type' : 'validation_failed',
        message: 'The request body could not be read',
        fields: { _: e.message ?? 'unreadable body' },
      },
    };
  return null;
}

export const notFoundApi: RequestHandler = (_req, _res, next) => {
  next(new AppError(404, 'not_found', 'No such API route'));
};

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (res.headersSent) return;
  if (err instanceof ZodError) {
    const fields = zodToFields(err);
    res.status(400).json({
      error: {
        code: 'validation_failed',
        message: `Check ${Object.keys(fields).join(', ')}`,
        fields,
      },
    });
    return;
  }
  if (err instanceof AppError) {
    if (err instanceof Busy) res.set('Retry-After', String(err.retryAfterSeconds));
    res
      .status(err.status)
      .json({ error: { code: err.code, message: err.message, ...err.details } });
    return;
  }
  const status =
    (err as { status?: number; statusCode?: number }).status ??
    (err as { statusCode?: number }).statusCode;
  if (status === 413 || (err as { code?: string }).code === 'LIMIT_FILE_SIZE') {
    res
      .status(413)
      .json({ error: { code: 'payload_too_large', message: 'The upload is larger than allowed' } });
    return;
  }
  const bodyError = bodyReadingError(err, status);
  if (bodyError) {
    res.status(bodyError.status).json({ error: bodyError.error });
    return;
  }
  if ((err as { code?: string }).code === 'ENOSPC') {
    res.status(507).json({
      error: {
        code: 'insufficient_storage',
        message: 'The server has no room to store this file; tell the network admin',
      },
    });
    return;
  }
  if (status === 400 && (err as { type?: string }).type === 'entity.parse.failed') {
    res.status(400).json({
      error: {
        code: 'validation_failed',
        message: 'The request body is not valid JSON',
        fields: { _: 'invalid JSON' },
      },
    });
    return;
  }
  if (isDatabaseDown(err)) {
    res.status(503).json({
      error: {
        code: 'service_unavailable',
        message: 'The database is not reachable; try again in a moment',
      },
    });
    return;
  }
  console.error(`[sheaf] ${req.method} ${req.originalUrl} failed:`, err);
  res
    .status(500)
    .json({ error: { code: 'internal_error', message: 'Something went wrong on the server' } });
};
