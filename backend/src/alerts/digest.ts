import type { Db } from '../db';
import { severity } from '../maths/health-levels';
import { sketchDetail } from '../services/sketches/detail';
import { listFleet, type FleetItem } from '../services/sketches/fleet';
import type { Clock } from './clock';
import { composeDigestMail, type DigestSketch } from './email/digest-email';
import { formatDay } from './email/figures';
import { enqueueMail } from './outbox';
import { recipientsOf } from './recipients';
import type { AlertSettings } from './settings';

const SOON_MS = 30 * 86_400_000;

const fleetOf = (db: Db, teams: string[], now: Date) =>
  listFleet(db, { teams, services: [], levels: [], q: undefined, sort: 'level', order: 'desc', page: 1, pageSize: 100_000, now });

/** Each sketch's resize plan (the sketch page's own), with what it adds across all the sketch's instances. */
async function resizesOf(db: Db, items: FleetItem[], now: Date): Promise<Map<number, DigestSketch['resize']>> {
  const plans = new Map<number, DigestSketch['resize']>();
  for (const item of items) {
    const plan = (await sketchDetail(db, item.id, now)).resizePlan;
    plans.set(item.id, plan?.resizeNeeded ? { width: plan.width, depth: plan.depth, addsBytes: plan.memoryChangeBytes * item.instanceCount } : null);
  }
  return plans;
}

/**
 * Puts each team's daily digest in the outbox: its sketches on watch or
 * worse, brim dates within 30 days, its memory and the fleet's, and what the
 * proposed resizes would add. Every collector process runs this on the same
 * schedule; the dedupe key (team and day) lets one copy through.
 */
export async function queueDigests(db: Db, clock: Clock, settings: AlertSettings): Promise<number> {
  const now = clock.now();
  const day = formatDay(now);
  const fleet = await fleetOf(db, [], now);
  const resizes = await resizesOf(db, fleet.items, now);
  const adds = (items: FleetItem[]) => items.reduce((sum, i) => sum + (resizes.get(i.id)?.addsBytes ?? 0), 0);
  let queued = 0;
  for (const team of await db('teams').orderBy('slug').select('id', 'slug', 'name')) {
    const items = fleet.items.filter((i) => i.team === team.slug);
    const recipients = await recipientsOf(db, Number(team.id), false);
    if (items.length === 0 || recipients.length === 0) continue;
    const view = (i: FleetItem): DigestSketch => ({ ...i, resize: resizes.get(i.id) ?? null });
    const soon = (i: FleetItem) => i.brimDate !== null && new Date(i.brimDate) > now && new Date(i.brimDate).getTime() - now.getTime() <= SOON_MS;
    const mail = composeDigestMail({
      team: { slug: team.slug, name: team.name },
      day,
      now,
      publicUrl: settings.publicUrl,
      sketchCount: items.length,
      troubled: items.filter((i) => severity(i.level) >= severity('watch')).map(view),
      brimmingSoon: items.filter(soon).sort((a, b) => (a.brimDate as string).localeCompare(b.brimDate as string)).map(view),
      teamMemoryBytes: (await fleetOf(db, [team.slug], now)).summary.totalMemoryBytes,
      teamResizeAddsBytes: adds(items),
      fleetMemoryBytes: fleet.summary.totalMemoryBytes,
      fleetResizeAddsBytes: adds(fleet.items),
      fleetSketchCount: fleet.total,
    });
    const id = await db.transaction((trx) => enqueueMail(trx, { kind: 'digest', teamId: Number(team.id), recipients, dedupeKey: `digest:${team.id}:${day}`, ...mail }, now));
    if (id !== null) queued += 1;
  }
  return queued;
}
