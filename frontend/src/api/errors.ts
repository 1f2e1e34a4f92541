// One error type for everything the API module can report, parsed from the
// server's `{ error: { code, message, field } }` body.

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly field?: string;

  constructor(status: number, code: string, message: string, field?: string) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.field = field;
  }
}

interface ErrorBody {
  error?: { code?: unknown; message?: unknown; field?: unknown };
}

function text(value: unknown): string | undefined {
  return typeof value === 'string' && value !== '' ? value : undefined;
}

/** Reads the server's error body; a body of another shape still gives a usable message. */
export function errorFromBody(status: number, body: unknown): ApiError {
  const detail = (body as ErrorBody | null)?.error;
  return new ApiError(
    status,
    text(detail?.code) ?? `http_${status}`,
    text(detail?.message) ?? `The server answered ${status} without saying why. Try again, or check the server's log.`,
    text(detail?.field),
  );
}

export function networkError(cause: unknown): ApiError {
  const reason = cause instanceof Error ? ` (${cause.message})` : '';
  return new ApiError(0, 'network', `The server did not answer${reason}. Check that Brimwatch is running.`);
}

/** Anything thrown while loading data, as an ApiError so pages show one kind of message. */
export function toApiError(cause: unknown): ApiError {
  if (cause instanceof ApiError) return cause;
  const message = cause instanceof Error ? cause.message : String(cause);
  return new ApiError(0, 'client', message);
}
