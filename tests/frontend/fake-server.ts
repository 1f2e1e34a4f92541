// A stand-in for the server's answers, keyed by path, installed as fetch.
import { vi } from 'vitest';

export type Answer = { status: number; body?: unknown };

export function answerWith(answers: Record<string, Answer>) {
  const fetchMock = vi.fn(async (input: RequestInfo | URL) => {
    const path = String(input).split('?')[0];
    const answer = answers[path] ?? { status: 404, body: { error: { code: 'not_found', message: `no ${path}` } } };
    return new Response(answer.body === undefined ? null : JSON.stringify(answer.body), {
      status: answer.status,
      headers: { 'content-type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return fetchMock;
}

export const HEALTHY: Answer = { status: 200, body: { status: 'ok', database: 'up', version: '0.1.0' } };
export const SIGNED_OUT: Answer = { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first.' } } };
