// Error types the services throw; the error handler turns them into the one JSON shape.
import type { ErrorCode } from '../shared/schemas/common';

export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode | 'csrf_invalid',
    message: string,
    readonly details: {
      fields?: Record<string, string>;
      rows?: { row: number; column: string; message: string }[];
      current?: unknown;
    } = {},
  ) {
    super(message);
  }
}

export class ValidationError extends AppError {
  constructor(message: string, fields: Record<string, string> = {}) {
    super(400, 'validation_failed', message, { fields });
  }
}
export class Unauthenticated extends AppError {
  constructor(message = 'Sign in to continue') {
    super(401, 'unauthenticated', message);
  }
}
export class Forbidden extends AppError {
  constructor(message = 'You do not have access to this') {
    super(403, 'forbidden', message);
  }
}
export class NotFound extends AppError {
  constructor(what = 'Resource') {
    super(404, 'not_found', `${what} not found`);
  }
}
export class Conflict extends AppError {
  constructor(message: string, current?: unknown) {
    super(409, 'conflict', message, { current });
  }
}
export class Locked extends AppError {
  constructor(message: string) {
    super(423, 'locked', message);
  }
}
export class InvalidRows extends AppError {
  constructor(message: string, rows: { row: number; column: string; message: string }[]) {
    super(422, 'invalid_rows', message, { rows });
  }
}
export class ServiceUnavailable extends AppError {
  constructor(message = 'The database is not reachable; try again in a moment') {
    super(503, 'service_unavailable', message);
  }
}

/** Too much work queued (e.g. PDF printing): 429 with a Retry-After header. */
export class Busy extends AppError {
  constructor(readonly retryAfterSeconds: number) {
    super(
      429,
      'rate_limited',
      `The server is busy printing; try again in ${retryAfterSeconds} seconds`,
    );
  }
}
