import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { afterEach, describe, expect, it } from 'vitest';
import { AppError, errorHandler } from '../../../backend/src/http/errors';
import { streamedUpload } from '../../../backend/src/http/streamed-upload';
import { jsonOf } from '../auth/sign-in-harness';
import { uploadForm } from './upload-form';

/** A bare app whose upload sink counts what reaches it, to see where the reading stops. */
async function serve(maxBytes: number, failAfter?: number) {
  const seen = { bytes: 0, chunks: 0 };
  const app = express();
  app.post(
    '/upload',
    streamedUpload({
      field: 'file',
      maxBytes,
      open: async () => ({
        write(chunk) {
          seen.bytes += chunk.length;
          seen.chunks++;
          if (failAfter !== undefined && seen.bytes >= failAfter) throw new AppError(400, 'bad_dump', `bad content near byte ${seen.bytes}`);
        },
        finish: () => seen.bytes,
      }),
    }),
    (req, res) => void res.json({ stored: (req.file as unknown as { result: number }).result }),
  );
  app.use(errorHandler(() => {}));
  const server = http.createServer(app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
  const url = `http://127.0.0.1:${(server.address() as AddressInfo).port}/upload`;
  return { url, seen, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

describe('streamedUpload', () => {
  let close: (() => Promise<void>) | undefined;
  afterEach(async () => {
    await close?.();
  });

  it('when a file is four megabytes over a 64 KiB limit, then 413 comes back and the sink never saw more than the limit and one byte', async () => {
    const server = await serve(64 * 1024);
    close = server.close;
    const res = await uploadForm(server.url, {}, {}, { bytes: new Uint8Array(4 * 1024 * 1024).fill(0x31) });
    expect(res.status).toBe(413);
    expect((await jsonOf(res)).error.code).toBe('too_large');
    expect(server.seen.bytes).toBeLessThanOrEqual(64 * 1024 + 1);
  });

  it('when the sink refuses the content early, then the 400 is the sink own and reading stops there', async () => {
    const server = await serve(64 * 1024 * 1024, 1);
    close = server.close;
    const res = await uploadForm(server.url, {}, {}, { bytes: new Uint8Array(8 * 1024 * 1024).fill(0x31) });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ code: 'bad_dump', message: expect.stringMatching(/bad content near byte/) });
    expect(server.seen.chunks).toBe(1);
  });

  it('when the file is within the limit, then the sink sees every byte and the route gets its result', async () => {
    const server = await serve(1024 * 1024);
    close = server.close;
    const res = await uploadForm(server.url, {}, {}, { bytes: new Uint8Array(300_000).fill(0x32) });
    expect(res.status).toBe(200);
    expect(await jsonOf(res)).toEqual({ stored: 300_000 });
  });

  it('when the multipart body is cut off, then it answers 400 rather than failing on the server', async () => {
    const server = await serve(1024 * 1024);
    close = server.close;
    const boundary = 'xyzzy';
    const body = `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="d.csv"\r\n\r\n1,2,3`;
    const res = await fetch(server.url, { method: 'POST', headers: { 'content-type': `multipart/form-data; boundary=${boundary}` }, body });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error.code).toBe('bad_upload');
  });
});
