import http from 'node:http';
import https from 'node:https';
import { ACCEPT } from './exposition/read-sketch';
import { pinnedLookup, type CheckedAddress } from './target-safety';

export type FetchFailureKind = 'timeout' | 'refused' | 'reset' | 'http status' | 'too large' | 'redirect' | 'network';

export type FetchResult =
  | { ok: true; body: string; contentType: string | undefined }
  | { ok: false; kind: FetchFailureKind; reason: string };

export interface FetchLimits {
  timeoutMs: number;
  maxBytes: number;
  userAgent: string;
}

const seconds = (ms: number) => `${Number((ms / 1000).toFixed(2))} s`;

/**
 * One GET of a checked URL, connecting only to the checked addresses. A
 * redirect is a failure (following it would leave the checked addresses); the
 * size cap holds while the body streams in, and the time limit covers a server
 * that sends headers and then stalls.
 */
export function fetchBody(url: URL, addresses: CheckedAddress[], limits: FetchLimits): Promise<FetchResult> {
  return new Promise((resolve) => {
    let settled = false;
    let headersSeen = false;
    const finish = (result: FetchResult) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      resolve(result);
      if (!request.destroyed) request.destroy();
    };
    const client = url.protocol === 'https:' ? https : http;
    const request = client.request(url, {
      method: 'GET',
      agent: false,
      lookup: pinnedLookup(addresses),
      headers: { accept: ACCEPT, 'accept-encoding': 'identity', 'user-agent': limits.userAgent },
    });
    const timer = setTimeout(() => {
      const stage = headersSeen ? 'the body did not finish' : 'no response';
      finish({ ok: false, kind: 'timeout', reason: `timeout after ${seconds(limits.timeoutMs)} (${stage})` });
    }, limits.timeoutMs);

    request.on('response', (response) => {
      headersSeen = true;
      const status = response.statusCode ?? 0;
      if (status >= 300 && status < 400) {
        const to = response.headers.location ? ` to ${String(response.headers.location).slice(0, 200)}` : '';
        return finish({ ok: false, kind: 'redirect', reason: `redirect refused: HTTP status ${status}${to}; register the final URL instead` });
      }
      if (status < 200 || status >= 300) return finish({ ok: false, kind: 'http status', reason: `HTTP status ${status}` });
      const tooLarge = { ok: false as const, kind: 'too large' as const, reason: `too large: the response exceeds SCRAPE_MAX_BYTES (${limits.maxBytes} bytes)` };
      if (Number(response.headers['content-length'] ?? 0) > limits.maxBytes) return finish(tooLarge);
      const chunks: Buffer[] = [];
      let size = 0;
      response.on('data', (chunk: Buffer) => {
        size += chunk.length;
        if (size > limits.maxBytes) return finish(tooLarge);
        chunks.push(chunk);
      });
      response.on('end', () => finish({ ok: true, body: Buffer.concat(chunks).toString('utf8'), contentType: response.headers['content-type'] }));
      response.on('aborted', () => finish({ ok: false, kind: 'reset', reason: 'connection reset: the response was cut short' }));
      response.on('error', (err) => finish(networkFailure(err)));
    });
    request.on('error', (err) => finish(networkFailure(err)));
    request.end();
  });
}

function networkFailure(err: Error): FetchResult {
  const code = (err as NodeJS.ErrnoException).code;
  if (code === 'ECONNREFUSED') return { ok: false, kind: 'refused', reason: 'connection refused' };
  if (code === 'ECONNRESET' || code === 'EPIPE' || err.message === 'socket hang up') {
    return { ok: false, kind: 'reset', reason: 'connection reset by the target' };
  }
  return { ok: false, kind: 'network', reason: `network error: ${code ?? err.message}` };
}
