// A stand-in for the server keyed by "METHOD /path" (fetch), and an XMLHttpRequest
// that reports upload progress and then answers, as a browser's would.
import { vi } from 'vitest';

export type Reply = { status: number; body?: unknown };

export function standInServer(routes: Record<string, Reply>) {
  const asked: string[] = [];
  vi.stubGlobal(
    'fetch',
    vi.fn(async (input: RequestInfo | URL, init?: RequestInit) => {
      const [path, query = ''] = String(input).split('?');
      const key = `${init?.method ?? 'GET'} ${path}`;
      asked.push(query ? `${key}?${query}` : key);
      const reply = routes[key] ?? { status: 404, body: { error: { code: 'not_found', message: `no ${key}` } } };
      return new Response(reply.body === undefined ? null : JSON.stringify(reply.body), { status: reply.status, headers: { 'content-type': 'application/json' } });
    }),
  );
  return { asked };
}

export interface SentForm {
  path: string;
  fields: [string, string][];
}

/** Each send reports half the body uploaded, waits for `release`, then answers with `reply`. */
export function standInUploads(reply: Reply) {
  const sent: SentForm[] = [];
  let release: () => void = () => {};
  const released = new Promise<void>((resolve) => (release = resolve));
  class StandInXhr {
    status = 0;
    responseText = '';
    upload: { onprogress: ((e: { lengthComputable: boolean; loaded: number; total: number }) => void) | null } = { onprogress: null };
    onload: (() => void) | null = null;
    onerror: (() => void) | null = null;
    private path = '';
    open(_method: string, path: string) {
      this.path = path;
    }
    setRequestHeader() {}
    send(form: FormData) {
      sent.push({ path: this.path, fields: [...form.entries()].map(([k, v]) => [k, typeof v === 'string' ? v : `file:${(v as File).name}`]) });
      this.upload.onprogress?.({ lengthComputable: true, loaded: 50, total: 100 });
      void released.then(() => {
        this.status = reply.status;
        this.responseText = JSON.stringify(reply.body);
        this.onload?.();
      });
    }
  }
  vi.stubGlobal('XMLHttpRequest', StandInXhr);
  return { sent, release: () => release() };
}

export const person = (role: string, teams: Array<{ id: number; slug: string; name: string }> = []) => ({
  id: 1, login: role, name: `The ${role}`, email: `${role}@larkfield.test`, role, teams,
});
