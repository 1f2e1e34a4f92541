import type { Db } from '../../../backend/src/db';
import { assess } from '../../../backend/src/maths/assess';
import type { HealthLevel } from '../../../backend/src/maths/health-levels';

export interface InstanceFixture {
  instance: string;
  /** The level the collector wrote; defaults to the level the load gives. */
  level?: HealthLevel;
  streamTotal?: number;
  width?: number;
  depth?: number;
  brimAt?: Date | null;
  lastError?: string | null;
}

export interface SketchFixture {
  service: string;
  sketch: string;
  team: string;
  errorBudget?: number;
  confidence?: number;
  instances: InstanceFixture[];
}

/** The judgement the collector stores, worked out by the maths module from the figures given. */
export function judgementOf(f: { width: number; depth: number; streamTotal: number; errorBudget: number; confidence: number; brimAt?: Date | null }) {
  const a = assess({ width: f.width, depth: f.depth, errorBudget: f.errorBudget, confidence: f.confidence, streamTotal: f.streamTotal });
  const brimAt = f.brimAt ? f.brimAt.toISOString() : null;
  return {
    ...a,
    brimAt,
    brimEarliest: brimAt,
    brimLatest: brimAt,
    trend: brimAt ? 'rising' : 'none',
    distinctEstimate: null,
    saturatedRows: 0,
    errorBudget: f.errorBudget,
    confidence: f.confidence,
    watchLine: 0.8,
  };
}

/** A sketch as the collector would leave it after some rounds: its service, targets and one status row per instance. */
export async function addSketch(db: Db, f: SketchFixture): Promise<{ id: number; targetIds: number[] }> {
  const team = await db('teams').where({ slug: f.team }).first('id');
  let service = await db('services').where({ name: f.service }).first('id');
  if (!service) [service] = await db('services').insert({ name: f.service, team_id: team.id }).returning('id');
  const errorBudget = f.errorBudget ?? 100;
  const confidence = f.confidence ?? 0.99;
  const [sketch] = await db('sketches')
    .insert({ name: f.sketch, service_id: service.id, team_id: team.id, error_budget: errorBudget, confidence })
    .returning('id');
  const targetIds: number[] = [];
  for (const [n, i] of f.instances.entries()) {
    const [target] = await db('targets').insert({ sketch_id: sketch.id, instance: i.instance, url: `http://127.0.0.1:${9600 + n}/metrics` }).returning('id');
    targetIds.push(Number(target.id));
    if (i.streamTotal === undefined && i.level === undefined) continue;
    const width = i.width ?? 272;
    const depth = i.depth ?? 5;
    const read = i.streamTotal !== undefined;
    const judgement = read ? judgementOf({ width, depth, streamTotal: i.streamTotal as number, errorBudget, confidence, brimAt: i.brimAt }) : null;
    await db('target_status').insert({
      target_id: target.id,
      sketch_id: sketch.id,
      level: i.level ?? judgement?.level,
      taken_at: new Date(),
      last_ok_at: read ? new Date() : null,
      last_error: i.lastError ?? null,
      stream_total: read ? i.streamTotal : null,
      width: read ? width : null,
      depth: read ? depth : null,
      counter_bytes: read ? 4 : null,
      window_seconds: read ? 0 : null,
      conservative: read ? false : null,
      judgement: judgement ? JSON.stringify(judgement) : null,
    });
  }
  return { id: Number(sketch.id), targetIds };
}
