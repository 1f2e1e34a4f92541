import type { Request, RequestHandler } from 'express';
import multer, { type StorageEngine } from 'multer';
import { formatBytes } from '../maths/format';
import { AppError } from './errors';

/** Where an uploaded file's bytes go as they arrive; `finish` gives what the route stores. */
export interface UploadSink<R> {
  write(chunk: Uint8Array): void;
  finish(): R;
}

export interface StreamedUploadOptions<R> {
  /** The multipart field that carries the file. */
  field: string;
  maxBytes: number;
  /** How long the upload may send nothing before it is refused (UPLOAD_IDLE_SECONDS); 30 s when not given. */
  idleMs?: number;
  /** Called when the file part begins: the form fields sent before it are in req.body. */
  open(req: Request, file: { originalname: string }): Promise<UploadSink<R>>;
}

/** The upload's outcome, on req.file once the route runs. */
export type StreamedFile<R> = Express.Multer.File & { result: R };

/**
 * multer with a storage engine that feeds the bytes to a sink as they stream,
 * so an upload is never held whole in memory or written to disk; the size
 * limit stops the stream at the limit, not after it. A file over the limit,
 * content the sink refuses, or an upload that stalls is answered at once and
 * the connection closed, rather than after reading (or waiting for) the rest.
 */
export function streamedUpload<R>(options: StreamedUploadOptions<R>): RequestHandler {
  const sinkFailures = new WeakSet<object>();
  const refusals = new WeakMap<Request, (error: unknown) => void>();
  const storage: StorageEngine = {
    _handleFile(req, file, cb) {
      let settled = false;
      const settle = (error: unknown, result?: R) => {
        if (settled) return;
        settled = true;
        if (error) {
          if (typeof error === 'object' && error !== null) sinkFailures.add(error);
          file.stream.resume();
          refusals.get(req)?.(error);
          cb(error as Error);
        } else cb(null, { result } as Partial<Express.Multer.File>);
      };
      file.stream.once('limit', () => refusals.get(req)?.(new multer.MulterError('LIMIT_FILE_SIZE', options.field)));
      options.open(req, file).then((sink) => {
        file.stream.on('data', (chunk: Buffer) => {
          if (settled) return;
          try {
            sink.write(chunk);
          } catch (error) {
            settle(error);
          }
        });
        file.stream.on('end', () => {
          if (settled) return;
          try {
            settle(null, sink.finish());
          } catch (error) {
            settle(error);
          }
        });
        file.stream.on('error', settle);
      }, settle);
    },
    _removeFile(_req, _file, cb) {
      cb(null);
    },
  };
  const upload = multer({ storage, limits: { fileSize: options.maxBytes, files: 1, fields: 20, fieldSize: 4096, parts: 22 } }).single(options.field);
  const idleMs = options.idleMs ?? 30_000;
  return (req, res, next) => {
    let answered = false;
    const answer = (error?: unknown) => {
      if (answered) return;
      answered = true;
      clearTimeout(idle);
      next(error ? uploadError(error, options, sinkFailures) : undefined);
    };
    // Refusing before the body has ended: answer now, then stop reading instead of draining what is left.
    refusals.set(req, (error) => {
      if (answered) return;
      res.setHeader('Connection', 'close');
      res.once('finish', () => setTimeout(() => req.destroy(), LINGER_MS).unref());
      answer(error);
    });
    let idle = setTimeout(stalled, idleMs);
    function stalled() {
      refusals.get(req)?.(
        new AppError(408, 'upload_stalled', `No bytes of the upload arrived for ${idleMs / 1000} s (UPLOAD_IDLE_SECONDS); nothing was stored. Send the file again.`, options.field),
      );
    }
    req.on('data', () => {
      clearTimeout(idle);
      if (!answered) idle = setTimeout(stalled, idleMs);
    });
    upload(req, res, answer);
  };
}

/** After an early answer, the client gets a moment to read it before the connection closes under its unsent bytes. */
const LINGER_MS = 500;

function uploadError(error: unknown, options: StreamedUploadOptions<unknown>, sinkFailures: WeakSet<object>): unknown {
  if (error instanceof AppError) return error;
  if (error instanceof multer.MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE') {
      return new AppError(413, 'too_large', `The file is larger than the upload limit of ${formatBytes(options.maxBytes)} (UPLOAD_MAX_BYTES); nothing was stored. Upload a smaller file, or ask an admin to raise the limit.`, options.field);
    }
    if (error.code === 'LIMIT_UNEXPECTED_FILE' || error.code === 'LIMIT_FILE_COUNT') {
      return new AppError(400, 'invalid', `Send exactly one file, in the form field '${options.field}'.`, options.field);
    }
    return new AppError(400, 'invalid', `The form is not one Brimwatch accepts (${error.message}): send the documented fields and one file in '${options.field}'.`);
  }
  if (typeof error === 'object' && error !== null && sinkFailures.has(error)) return error;
  // What is left comes from reading the multipart body itself: a truncated or malformed request.
  const reason = error instanceof Error ? error.message : String(error);
  return new AppError(400, 'bad_upload', `The upload is not a complete multipart/form-data body (${reason}); send it again.`);
}
