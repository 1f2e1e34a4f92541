// A stand-in server for the Admin page, keyed by "METHOD /path", that records what was sent.
import { vi } from 'vitest';

type Reply = { status: number; body?: unknown };
export type Routes = Record<string, Reply | ((body: unknown) => Reply)>;

export function adminServer(routes: Routes) {
  const sent: Array<{ method: string; path: string; query: string; body: unknown }> = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
    const [path, query = ''] = String(input).split('?');
    const method = init?.method ?? 'GET';
    const body = typeof init?.body === 'string' ? JSON.parse(init.body) : undefined;
    sent.push({ method, path, query, body });
    const route = routes[`${method} ${path}`];
    const reply = typeof route === 'function' ? route(body) : (route ?? { status: 404, body: { error: { code: 'not_found', message: `no ${method} ${path}` } } });
    return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), { status: reply.status, headers: { 'content-type': 'application/json' } });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { sent };
}

export const person = (role: string, teams: Array<{ id: number; slug: string; name: string }> = []) => ({
  id: 1, login: role, name: `The ${role}`, email: `${role}@larkfield.test`, role, teams,
});

export const PAYMENTS = { id: 1, slug: 'payments', name: 'Payments', alertEmail: 'payments-alerts@larkfield.test', escalationEmail: null, members: [] };
export const DISCOVERY = { id: 2, slug: 'discovery', name: 'Discovery', alertEmail: null, escalationEmail: null, members: [] };
