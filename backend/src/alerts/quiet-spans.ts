import type { Q } from './alert-store';
import type { QuietSpan } from './notify-decision';

export interface SketchPlace {
  sketchId: number;
  serviceId: number;
  teamId: number;
}

/** The quiet windows in force at `now` over a sketch, its service or its team. */
export async function quietSpansOver(q: Q, place: SketchPlace, now: Date): Promise<QuietSpan[]> {
  const rows = await q('quiet_windows')
    .whereNull('cancelled_at')
    .where('starts_at', '<=', now)
    .where('ends_at', '>', now)
    .where((w) =>
      w
        .where({ scope: 'sketch', sketch_id: place.sketchId })
        .orWhere({ scope: 'service', service_id: place.serviceId })
        .orWhere({ scope: 'team', team_id: place.teamId }),
    )
    .select('starts_at', 'ends_at');
  return rows.map((r: { starts_at: Date; ends_at: Date }) => ({ startsAt: new Date(r.starts_at), endsAt: new Date(r.ends_at) }));
}

export async function placeOf(q: Q, sketchId: number): Promise<SketchPlace | null> {
  const row = await q('sketches').where({ id: sketchId }).first('id', 'service_id', 'team_id');
  return row ? { sketchId: Number(row.id), serviceId: Number(row.service_id), teamId: Number(row.team_id) } : null;
}
