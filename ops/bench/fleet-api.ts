import { loadConfig } from '../../backend/src/config';
import type { Db } from '../../backend/src/db';
import { start } from '../../backend/src/server';
import { createToken } from '../../backend/src/services/access/tokens';
import { percentile, timeEach, type BenchRow } from './report';

const SAMPLES = 100;

/**
 * p50/p95 of the fleet list and of a 90-day chart through the real web server
 * (authenticated by an API token made by the token module), against the
 * trivial /api/health on the same server, requests one after another.
 */
export async function fleetApiRows(db: Db, url: string, chartedSketchId: number, readings: number): Promise<BenchRow[]> {
  const [user] = await db('users').insert({ login: 'bench-viewer', name: 'Bench Viewer', email: 'bench-viewer@brimwatch.test', role: 'viewer' }).returning('id');
  const { secret } = await createToken(db, 'system', { userId: Number(user.id), label: 'benchmark', role: 'viewer', expiresInDays: 1 });
  const server = await start(loadConfig({ NODE_ENV: 'production', PORT: '0', DATABASE_URL: url, DEMO: 'false' }), { log: (line) => console.log(`  [web] ${line}`) });
  const headers = { authorization: `Bearer ${secret}` };
  const get = async (path: string) => {
    const res = await fetch(server.url + path, { headers });
    const body = await res.text();
    if (res.status !== 200) throw new Error(`GET ${path} answered ${res.status}: ${body.slice(0, 300)}`);
    return body;
  };
  const to = new Date();
  const from = new Date(to.getTime() - 90 * 86_400_000);
  const chart = `/api/v1/sketches/${chartedSketchId}/readings?points=1000&from=${from.toISOString()}&to=${to.toISOString()}`;
  try {
    const points = JSON.parse(await get(chart)).points.length;
    const listed = JSON.parse(await get('/api/v1/sketches')).total;
    for (const path of ['/api/health', '/api/v1/sketches', chart]) await timeEach(5, () => get(path));
    const health = await timeEach(SAMPLES, () => get('/api/health'));
    const fleet = await timeEach(SAMPLES, () => get('/api/v1/sketches'));
    const history = await timeEach(SAMPLES, () => get(chart));
    const row = (figure: string, times: number[], goalMs: number, note: string): BenchRow[] =>
      [50, 95].map((p) => ({
        figure: `${figure} p${p}`,
        measured: percentile(times, p),
        baseline: percentile(health, p),
        baselineName: `GET /api/health p${p}`,
        unit: 'ms',
        ratio: percentile(times, p) / percentile(health, p),
        goal: p === 95 ? `p95 < ${goalMs} ms` : '—',
        met: p === 95 ? percentile(times, p) < goalMs : true,
        note,
      }));
    return [
      ...row(`GET /api/v1/sketches (${listed.toLocaleString('en-GB')} sketches)`, fleet, 50, ''),
      ...row(`GET …/readings?points=1000 (90 days, ${points} buckets)`, history, 150, `${readings.toLocaleString('en-GB')} readings in the table`),
    ];
  } finally {
    await server.stop();
  }
}
