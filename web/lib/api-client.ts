/**
 * The one way the web app talks to the Sheaf API: JSON in and out, same-origin cookies,
 * a CSRF token on every state-changing request, and typed `ApiError`s for non-2xx answers.
 */
import { z } from 'zod';
import { CsrfTokenSchema } from '../../shared/schemas/auth';
import type { ApiErrorBody } from '../../shared/schemas/common';

export type RowError = NonNullable<ApiErrorBody['error']['rows']>[number];

/** A failed API call: the HTTP status plus the stable `code` and details from the error body. */
export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly fields: Record<string, string>;
  readonly rows: RowError[];
  /** The server's current version of a resource, sent with some `conflict` answers. */
  readonly current: unknown;

  constructor(
    status: number,
    code: string,
    message: string,
    details: { fields?: Record<string, string>; rows?: RowError[]; current?: unknown } = {},
  ) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.fields = details.fields ?? {};
    this.rows = details.rows ?? [];
    this.current = details.current;
  }
}

export function isApiError(error: unknown, status?: number): error is ApiError {
  return error instanceof ApiError && (status === undefined || error.status === status);
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';
const UNSAFE_METHODS = new Set<Method>(['POST', 'PATCH', 'PUT', 'DELETE']);

export interface RequestOptions {
  /** A JSON-serialisable value, or FormData for uploads (sent as multipart). */
  body?: unknown;
  signal?: AbortSignal;
  headers?: Record<string, string>;
}

let csrfToken: Promise<string> | null = null;

async function fetchCsrfToken(): Promise<string> {
  const response = await send('GET', '/api/auth/csrf', {});
  return CsrfTokenSchema.parse(await readBody(response)).csrfToken;
}

/** The session's CSRF token, fetched once and shared by every request. */
function getCsrfToken(): Promise<string> {
  if (!csrfToken) {
    csrfToken = fetchCsrfToken().catch((error: unknown) => {
      csrfToken = null;
      throw error;
    });
  }
  return csrfToken;
}

/** Forgets the CSRF token; the server issues a new one after sign-out. */
export function resetCsrfToken(): void {
  csrfToken = null;
}

async function send(method: Method, path: string, options: RequestOptions, token?: string) {
  const headers: Record<string, string> = { Accept: 'application/json', ...options.headers };
  let body: BodyInit | undefined;
  if (options.body instanceof FormData) {
    body = options.body;
  } else if (options.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(options.body);
  }
  if (token) headers['X-CSRF-Token'] = token;

  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      body,
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(
      0,
      'network_error',
      'Sheaf could not reach the server. Check the connection and try again.',
    );
  }
  if (!response.ok) throw await toApiError(response);
  return response;
}

async function readBody(response: Response): Promise<unknown> {
  if (response.status === 204 || response.status === 205) return undefined;
  const text = await response.text();
  if (!text) return undefined;
  const type = response.headers.get('Content-Type') ?? '';
  return type.includes('json') ? JSON.parse(text) : text;
}

async function toApiError(response: Response): Promise<ApiError> {
  let body: unknown;
  try {
    body = await readBody(response);
  } catch {
    body = undefined;
  }
  const error =
    body &&
    typeof body === 'object' &&
    'error' in body &&
    body.error &&
    typeof body.error === 'object'
      ? (body.error as Partial<ApiErrorBody['error']>)
      : undefined;
  return new ApiError(
    response.status,
    typeof error?.code === 'string' ? error.code : fallbackCode(response.status),
    typeof error?.message === 'string' ? error.message : `The server answered ${response.status}.`,
    { fields: error?.fields, rows: error?.rows, current: error?.current },
  );
}

function fallbackCode(status: number): string {
  if (status === 401) return 'unauthenticated';
  if (status === 403) return 'forbidden';
  if (status === 404) return 'not_found';
  if (status === 429) return 'rate_limited';
  return status >= 500 ? 'internal_error' : 'request_failed';
}

/**
 * An answer whose shape is not what the page expects (an older or newer server, a proxy's error
 * page): named here, at the API boundary, instead of crashing a component later.
 */
export class UnexpectedResponseError extends Error {
  readonly path: string;
  readonly issues: z.core.$ZodIssue[];

  constructor(method: Method, path: string, error: z.ZodError) {
    const first = error.issues[0];
    const where = first?.path.length ? ` at ${first.path.join('.')}` : '';
    super(`${method} ${path} answered an unexpected shape${where}: ${first?.message ?? ''}`);
    this.name = 'UnexpectedResponseError';
    this.path = path;
    this.issues = error.issues;
  }
}

async function sendAndRead(method: Method, path: string, options: RequestOptions) {
  if (!UNSAFE_METHODS.has(method)) return readBody(await send(method, path, options));
  try {
    return await readBody(await send(method, path, options, await getCsrfToken()));
  } catch (error) {
    // The token expires with the session: fetch a fresh one and try exactly once more.
    if (isApiError(error, 403) && error.code === 'csrf_invalid') {
      resetCsrfToken();
      return readBody(await send(method, path, options, await getCsrfToken()));
    }
    throw error;
  }
}

/** Sends one request and parses its JSON answer with the response's schema. */
export async function request<S extends z.ZodType>(
  method: Method,
  path: string,
  schema: S,
  options: RequestOptions = {},
): Promise<z.output<S>> {
  const body = await sendAndRead(method, path, options);
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw new UnexpectedResponseError(method, path, parsed.error);
  return parsed.data;
}

/** A 204 answer, or one whose body the caller does not need. */
export const NoContent = z.unknown().transform(() => undefined);

/** Sends one request whose answer the caller parses itself (kept for callers outside web/features that parse). */
export function requestUnparsed(method: Method, path: string, options: RequestOptions = {}) {
  return sendAndRead(method, path, options) as Promise<unknown>;
}

type ReadOptions = Omit<RequestOptions, 'body'>;

function get<S extends z.ZodType>(
  path: string,
  schema: S,
  options?: ReadOptions,
): Promise<z.output<S>>;
function get(path: string, options?: ReadOptions): Promise<unknown>;
function get(path: string, schemaOrOptions?: z.ZodType | ReadOptions, options?: ReadOptions) {
  return schemaOrOptions instanceof z.ZodType
    ? request('GET', path, schemaOrOptions, options)
    : requestUnparsed('GET', path, schemaOrOptions);
}

function writer(method: Exclude<Method, 'GET'>) {
  function write<S extends z.ZodType>(
    path: string,
    schema: S,
    body?: unknown,
    options?: RequestOptions,
  ): Promise<z.output<S>>;
  function write(path: string, body?: unknown, options?: RequestOptions): Promise<unknown>;
  function write(
    path: string,
    schemaOrBody?: unknown,
    bodyOrOptions?: unknown,
    options?: RequestOptions,
  ) {
    return schemaOrBody instanceof z.ZodType
      ? request(method, path, schemaOrBody, { ...options, body: bodyOrOptions })
      : requestUnparsed(method, path, { ...(bodyOrOptions as RequestOptions), body: schemaOrBody });
  }
  return write;
}

/**
 * `api.get(path, Schema)` and `api.post(path, Schema, body)` parse the answer with the schema;
 * the forms without a schema return `unknown` for callers that parse it themselves.
 */
export const api = {
  get,
  post: writer('POST'),
  patch: writer('PATCH'),
  put: writer('PUT'),
  delete: writer('DELETE'),
};
