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
export async function fleetApiRows(db: Db, url: string, chartedSketchId: number, stored: { readings: number; rollupHours: number }): Promise<BenchRow[]> {
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
  // A day in 1,000 buckets of under an hour: every bucket from the raw readings.
  const day = `/api/v1/sketches/${chartedSketchId}/readings?points=1000&from=${new Date(to.getTime() - 86_400_000).toISOString()}&to=${to.toISOString()}`;
  try {
    const points = JSON.parse(await get(chart)).points.length;
    const listed = JSON.parse(await get('/api/v1/sketches')).total;
    for (const path of ['/api/health', '/api/v1/sketches', chart, day]) await timeEach(5, () => get(path));
    const health = await timeEach(SAMPLES, () => get('/api/health'));
    const fleet = await timeEach(SAMPLES, () => get('/api/v1/sketches'));
    const history = await timeEach(SAMPLES, () => get(chart));
    const lastDay = await timeEach(SAMPLES, () => get(day));
    const row = (figure: string, times: number[], goalMs: number | null, note: string): BenchRow[] =>
      [50, 95].map((p) => ({
        figure: `${figure} p${p}`,
        measured: percentile(times, p),
        baseline: percentile(health, p),
        baselineName: `GET /api/health p${p}`,
        unit: 'ms',
        ratio: percentile(times, p) / percentile(health, p),
        goal: p === 95 && goalMs !== null ? `p95 < ${goalMs} ms` : '—',
        met: p === 95 && goalMs !== null ? percentile(times, p) < goalMs : true,
        note,
      }));
    return [
      ...row(`GET /api/v1/sketches (${listed.toLocaleString('en-GB')} sketches)`, fleet, 50, ''),
      ...row(
        `GET …/readings?points=1000 (90 days, ${points} buckets)`,
        history,
        150,
        `${stored.readings.toLocaleString('en-GB')} readings and ${stored.rollupHours.toLocaleString('en-GB')} hourly rollups in the tables; buckets of 2.2 h, from the rollups up to the latest rolled-up hour and from the raw readings after it`,
      ),
      ...row('GET …/readings?points=1000 (last 24 hours)', lastDay, null, 'buckets of 86 s, all from the raw readings (2,880 for the sketch)'),
    ];
  } finally {
    await server.stop();
  }
}
