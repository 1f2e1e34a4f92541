import type { Db } from '../../../backend/src/db';

export const T0 = Date.parse('2026-11-30T00:00:00Z');
export const MIN = 60_000;

/** A team, service, sketch and its targets, scraped every minute (so stale after three minutes). */
export async function addSketch(db: Db, team: string, service: string, sketch: string, instances: string[]) {
  const existing = await db('teams').where({ slug: team }).first('id');
  const teamId = existing ? Number(existing.id) : Number((await db('teams').insert({ slug: team, name: team }, ['id']))[0].id);
  const [sv] = await db('services').insert({ team_id: teamId, name: service }, ['id']);
  const [sk] = await db('sketches').insert({ service_id: sv.id, team_id: teamId, name: sketch, error_budget: 100, confidence: 0.99, scrape_interval_seconds: 60 }, ['id']);
  const targets = await db('targets').insert(instances.map((instance, i) => ({ sketch_id: sk.id, instance, url: `http://127.0.0.1:95${i}0/metrics` })), ['id']);
  return { teamId, sketchId: Number(sk.id), targetIds: targets.map((t: { id: number }) => Number(t.id)) };
}

/** One reading a minute from `fromMinute` to `toMinute` inclusive; `level` of null stores a failed scrape. */
export async function addReadings(db: Db, sketchId: number, targetId: number, fromMinute: number, toMinute: number, level: string | null) {
  const rows = [];
  for (let m = fromMinute; m <= toMinute; m++) {
    const taken_at = new Date(T0 + m * MIN);
    rows.push(
      level === null
        ? { target_id: targetId, sketch_id: sketchId, taken_at, ok: false, failure_reason: 'connection refused' }
        : { target_id: targetId, sketch_id: sketchId, taken_at, ok: true, stream_total: 1000 + m, width: 2048, depth: 5, judgement: JSON.stringify({ level, load: 0.5 }) },
    );
  }
  await db('readings').insert(rows);
}
