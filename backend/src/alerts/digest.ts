import type { Db } from '../db';
import { compareWorstFirst, severity } from '../maths/health-levels';
import { sketchDetail } from '../services/sketches/detail';
import type { Clock } from './clock';
import { digestRows, type DigestRow } from './digest-rows';
import { composeDigestMail, type DigestSketch } from './email/digest-email';
import { formatDay } from './email/figures';
import { enqueueMail } from './outbox';
import { recipientsOf } from './recipients';
import type { AlertSettings } from './settings';

const SOON_MS = 30 * 86_400_000;

/** Each sketch's resize plan (the sketch page's own), with what it adds across all the sketch's instances. */
async function resizesOf(db: Db, rows: DigestRow[], now: Date): Promise<Map<number, DigestSketch['resize']>> {
  const plans = new Map<number, DigestSketch['resize']>();
  for (const row of rows) {
    const plan = (await sketchDetail(db, row.id, now)).resizePlan;
    plans.set(row.id, plan?.resizeNeeded ? { width: plan.width, depth: plan.depth, addsBytes: plan.memoryChangeBytes * row.instances } : null);
  }
  return plans;
}

const memoryOf = (rows: DigestRow[]) => rows.reduce((sum, r) => sum + r.memoryBytes, 0);
const worstFirst = (a: DigestRow, b: DigestRow) => compareWorstFirst(a.figures.level, b.figures.level) || (b.figures.load ?? -1) - (a.figures.load ?? -1);

/**
 * Puts each team's daily digest in the outbox: its sketches on watch or
 * worse, brim dates within 30 days, its memory and the fleet's, and what the
 * proposed resizes would add. Every collector process runs this on the same
 * schedule; the dedupe key (team and day) lets one copy through.
 */
export async function queueDigests(db: Db, clock: Clock, settings: AlertSettings): Promise<number> {
  const now = clock.now();
  const day = formatDay(now);
  const fleet = await digestRows(db);
  const resizes = await resizesOf(db, fleet, now);
  const adds = (rows: DigestRow[]) => rows.reduce((sum, r) => sum + (resizes.get(r.id)?.addsBytes ?? 0), 0);
  let queued = 0;
  for (const team of await db('teams').orderBy('slug').select('id', 'slug', 'name')) {
    const items = fleet.filter((r) => r.team === team.slug).sort(worstFirst);
    const recipients = await recipientsOf(db, Number(team.id), false);
    if (items.length === 0 || recipients.length === 0) continue;
    const view = (r: DigestRow): DigestSketch => ({ ...r.figures, service: r.service, sketch: r.sketch, resize: resizes.get(r.id) ?? null });
    const brim = (r: DigestRow) => (r.figures.brimDate === null ? null : new Date(r.figures.brimDate).getTime());
    const soon = (r: DigestRow) => {
      const at = brim(r);
      return at !== null && at > now.getTime() && at - now.getTime() <= SOON_MS;
    };
    const mail = composeDigestMail({
      team: { slug: team.slug, name: team.name },
      day,
      now,
      publicUrl: settings.publicUrl,
      sketchCount: items.length,
      troubled: items.filter((r) => severity(r.figures.level) >= severity('watch')).map(view),
      brimmingSoon: items.filter(soon).sort((a, b) => (brim(a) as number) - (brim(b) as number)).map(view),
      teamMemoryBytes: memoryOf(items),
      teamResizeAddsBytes: adds(items),
      fleetMemoryBytes: memoryOf(fleet),
      fleetResizeAddsBytes: adds(fleet),
      fleetSketchCount: fleet.length,
    });
    const id = await db.transaction((trx) => enqueueMail(trx, { kind: 'digest', teamId: Number(team.id), recipients, dedupeKey: `digest:${team.id}:${day}`, ...mail }, now));
    if (id !== null) queued += 1;
  }
  return queued;
}
