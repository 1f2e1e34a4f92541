// The one way the front end talks to the server: same-origin cookies (no token
// in storage), JSON both ways, one error type, and one place that reacts to 401.
import { ApiError, errorFromBody, networkError } from './errors';

export { ApiError } from './errors';

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  query?: Record<string, string | number | boolean | undefined>;
  body?: unknown;
  signal?: AbortSignal;
  /** Statuses whose JSON body is an answer rather than an error (e.g. 503 from /api/health). */
  answerStatuses?: number[];
  /** Set where being signed out is an answer, not a reason to leave the page (e.g. /api/auth/me). */
  anonymousOk?: boolean;
}

type UnauthorizedHandler = () => void;
let unauthorized: UnauthorizedHandler = () => {};

/** The router registers here how a 401 sends the user to sign in. */
export function onUnauthorized(handler: UnauthorizedHandler): void {
  unauthorized = handler;
}

/** For requests made outside `request` (uploads with progress): the same reaction to a 401. */
export function reportUnauthorized(): void {
  unauthorized();
}

function urlFor(path: string, query: RequestOptions['query']): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(query ?? {})) {
    if (value !== undefined) params.set(key, String(value));
  }
  const search = params.toString();
  return search ? `${path}?${search}` : path;
}

async function readJson(response: Response): Promise<unknown> {
  const type = response.headers.get('content-type') ?? '';
  if (response.status === 204 || !type.includes('json')) return null;
  try {
    return await response.json();
  } catch {
    return null;
  }
}

export async function request<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const hasBody = options.body !== undefined;
  let response: Response;
  try {
    response = await fetch(urlFor(path, options.query), {
      method: options.method ?? 'GET',
      credentials: 'same-origin',
      headers: { Accept: 'application/json', ...(hasBody ? { 'Content-Type': 'application/json' } : {}) },
      body: hasBody ? JSON.stringify(options.body) : undefined,
      signal: options.signal,
    });
  } catch (cause) {
    throw networkError(cause);
  }
  const body = await readJson(response);
  if (response.ok || options.answerStatuses?.includes(response.status)) return body as T;
  const error = errorFromBody(response.status, body);
  if (response.status === 401 && !options.anonymousOk) unauthorized();
  throw error;
}

/** Reads a resource; writes go through `request` with a method and a body. */
export function get<T>(path: string, options: Omit<RequestOptions, 'method' | 'body'> = {}): Promise<T> {
  return request<T>(path, { ...options, method: 'GET' });
}

export function isApiError(value: unknown, status?: number): value is ApiError {
  return value instanceof ApiError && (status === undefined || value.status === status);
}
