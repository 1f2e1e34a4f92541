import type { ErrorRequestHandler, RequestHandler } from 'express';

/** The one error type routes and services throw: an HTTP status, a machine-readable code, and the field at fault. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly field?: string,
    options?: { cause?: unknown },
  ) {
    super(message, options);
    this.name = 'AppError';
  }
}

export const notFoundRoute: RequestHandler = (req, _res, next) => {
  next(new AppError(404, 'not_found', `There is no API route ${req.method} ${req.path}; see README.md for the routes.`));
};

/** The single error path: known errors answer with their status; anything else is a generic 500 with the stack in the log. */
export function errorHandler(log: (line: string) => void = console.error): ErrorRequestHandler {
  return (err, req, res, _next) => {
    if (err instanceof AppError) {
      res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.field ? { field: err.field } : {}) } });
      return;
    }
    if (err?.type === 'entity.parse.failed') {
      res.status(400).json({ error: { code: 'bad_json', message: 'The request body is not valid JSON; send a JSON object with Content-Type: application/json.' } });
      return;
    }
    if (err?.type === 'entity.too.large') {
      res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large; send a smaller body.' } });
      return;
    }
    log(`[web] ${req.method} ${req.originalUrl} failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; the error is in the server log.' } });
  };
}
