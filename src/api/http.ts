import { z } from 'zod';
import type { ApiErrorBody } from '@shared/http';

/** Every failed API call surfaces as one of these, shaped like the server's error body. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
    /** The whole `error` object of the body, for endpoints that add more (e.g. a plan's `violations`). */
    readonly details: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/** Turns anything thrown into an ApiError so views have one shape to show. */
export function asApiError(error: unknown): ApiError {
  if (error instanceof ApiError) return error;
  return new ApiError(0, 'client_error', 'Something went wrong in the page. Please reload and try again.');
}

/**
 * How the wrapper reaches the session state it does not own: the auth store binds these once,
 * so the CSRF token has a single home and a 401 is handled in exactly one place.
 */
export interface HttpSessionHooks {
  getCsrfToken(): string | null;
  setCsrfToken(token: string | null): void;
  onUnauthorized(error: ApiError): void;
}

let memoryToken: string | null = null;
let hooks: HttpSessionHooks = {
  getCsrfToken: () => memoryToken,
  setCsrfToken: (token) => {
    memoryToken = token;
  },
  onUnauthorized: () => {},
};

export function bindHttpSession(next: HttpSessionHooks): void {
  hooks = next;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

interface RequestOptions {
  /** For calls where "not signed in" is an expected answer (who am I, sign out). */
  expectUnauthorized?: boolean;
}

const errorBodySchema: z.ZodType<ApiErrorBody> = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
const csrfSchema = z.object({ csrfToken: z.string().min(1) });

const NETWORK_MESSAGE = 'We could not reach Saddlestep. Check your connection and try again.';
const UNREADABLE_MESSAGE = 'The server sent an answer we could not read. Please try again.';

function fallbackMessage(status: number): string {
  if (status === 429) return 'Too many attempts. Please wait a few minutes and try again.';
  if (status >= 500) return 'Something went wrong on our side. Please try again.';
  return `The request failed (status ${status}). Please try again.`;
}

async function perform(method: Method, path: string, body: unknown, csrfToken: string | null): Promise<Response> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (csrfToken) headers['X-CSRF-Token'] = csrfToken;
  try {
    return await fetch(path, {
      method,
      headers,
      credentials: 'same-origin',
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch {
    throw new ApiError(0, 'network_error', NETWORK_MESSAGE);
  }
}

async function readJson(response: Response): Promise<unknown> {
  try {
    return await response.json();
  } catch {
    throw new ApiError(response.status, 'bad_response', UNREADABLE_MESSAGE);
  }
}

async function toApiError(response: Response): Promise<ApiError> {
  const body: unknown = await response.json().catch(() => null);
  const parsed = errorBodySchema.safeParse(body);
  if (!parsed.success) return new ApiError(response.status, 'http_error', fallbackMessage(response.status));
  const { code, message, fields } = parsed.data.error;
  return new ApiError(response.status, code, message, fields, (body as { error: Record<string, unknown> }).error);
}

// Several requests may find the token missing at once; they share one fetch.
let pendingToken: Promise<string> | null = null;

async function csrfToken(fresh: boolean): Promise<string> {
  const known = hooks.getCsrfToken();
  if (known && !fresh) return known;
  pendingToken ??= (async () => {
    const response = await perform('GET', '/api/auth/csrf', undefined, null);
    if (!response.ok) throw await toApiError(response);
    const parsed = csrfSchema.safeParse(await readJson(response));
    if (!parsed.success) throw new ApiError(response.status, 'bad_response', UNREADABLE_MESSAGE);
    hooks.setCsrfToken(parsed.data.csrfToken);
    return parsed.data.csrfToken;
  })().finally(() => {
    pendingToken = null;
  });
  return pendingToken;
}

async function send(method: Method, path: string, body: unknown, options: RequestOptions): Promise<Response> {
  const unsafe = method !== 'GET';
  let response = await perform(method, path, body, unsafe ? await csrfToken(false) : null);
  let error = response.ok ? null : await toApiError(response);
  // The token dies with the session (sign-in regenerates it, it can expire): refresh once.
  if (unsafe && error?.status === 403 && error.code === 'csrf_failed') {
    response = await perform(method, path, body, await csrfToken(true));
    error = response.ok ? null : await toApiError(response);
  }
  if (error) {
    if (error.status === 401 && error.code === 'not_signed_in' && !options.expectUnauthorized) hooks.onUnauthorized(error);
    throw error;
  }
  return response;
}

async function parsed<T>(response: Response, schema: z.ZodType<T>): Promise<T> {
  const result = schema.safeParse(await readJson(response));
  if (!result.success) throw new ApiError(response.status, 'bad_response', UNREADABLE_MESSAGE);
  return result.data;
}

/**
 * The only way the client talks to the API: same-origin JSON, the CSRF header on every
 * state-changing call, and every answer checked against a schema before anyone reads it.
 */
export const http = {
  async get<T>(path: string, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
    return parsed(await send('GET', path, undefined, options), schema);
  },
  async post<T>(path: string, body: unknown, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
    return parsed(await send('POST', path, body, options), schema);
  },
  async put<T>(path: string, body: unknown, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
    return parsed(await send('PUT', path, body, options), schema);
  },
  async patch<T>(path: string, body: unknown, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
    return parsed(await send('PATCH', path, body, options), schema);
  },
  /** DELETE, for endpoints that answer 204 No Content. */
  async deleteEmpty(path: string, options: RequestOptions = {}): Promise<void> {
    await send('DELETE', path, undefined, options);
  },
  /** DELETE with a JSON body (e.g. a password to confirm), for endpoints that answer 204 No Content. */
  async del(path: string, body: unknown, options: RequestOptions = {}): Promise<void> {
    await send('DELETE', path, body, options);
  },
  /** For endpoints that answer 204 No Content. */
  async postEmpty(path: string, body?: unknown, options: RequestOptions = {}): Promise<void> {
    await send('POST', path, body, options);
  },
};

/**
 * The same session plumbing for the one other transport, XHR uploads with progress
 * (src/api/uploads.ts): the CSRF token (fresh after a stale-token refusal), the error shape, and
 * the one place a 401 is reported.
 */
export const uploadSession = {
  csrfToken: (fresh: boolean) => csrfToken(fresh),
  errorFromBody(status: number, body: unknown): ApiError {
    const parsedBody = errorBodySchema.safeParse(body);
    if (!parsedBody.success) return new ApiError(status, 'http_error', fallbackMessage(status));
    const { code, message, fields } = parsedBody.data.error;
    return new ApiError(status, code, message, fields);
  },
  unauthorized: (error: ApiError) => hooks.onUnauthorized(error),
  networkError: () => new ApiError(0, 'network_error', NETWORK_MESSAGE),
  unreadable: (status: number) => new ApiError(status, 'bad_response', UNREADABLE_MESSAGE),
};
