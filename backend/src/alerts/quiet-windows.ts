import type { QuietScope, QuietWindow } from '../api-types';
import type { Caller } from '../auth/caller';
import { recordAudit } from '../audit/record';
import type { Db } from '../db';
import { AppError } from '../http/errors';
import { teamIdOf } from './alert-service';
import type { Q } from './alert-store';

export interface QuietWindowInput {
  scope: QuietScope;
  sketchId?: number;
  service?: string;
  team?: string;
  startsAt?: Date;
  endsAt: Date;
  reason: string;
}

/** Longer than this is not a planned piece of work; it would hide a real problem. */
export const MAX_QUIET_DAYS = 30;
const DAY_MS = 86_400_000;

const iso = (v: unknown) => (v === null || v === undefined ? null : new Date(v as string).toISOString());

function viewOf(r: Record<string, unknown>, now: Date): QuietWindow {
  const starts = new Date(r.starts_at as string);
  const ends = new Date(r.ends_at as string);
  const status = r.cancelled_at ? 'ended early' : now < starts ? 'upcoming' : now < ends ? 'in force' : 'over';
  return {
    id: Number(r.id),
    scope: r.scope as QuietScope,
    sketchId: r.sketch_id === null ? null : Number(r.sketch_id),
    sketch: (r.sketch as string | null) ?? null,
    service: (r.service as string | null) ?? null,
    team: (r.team as string | null) ?? null,
    teamName: (r.team_name as string | null) ?? null,
    startsAt: starts.toISOString(),
    endsAt: ends.toISOString(),
    reason: String(r.reason),
    createdBy: String(r.created_by_login),
    createdAt: iso(r.created_at) as string,
    cancelledAt: iso(r.cancelled_at),
    cancelledBy: (r.cancelled_by_login as string | null) ?? null,
    status,
  };
}

function windowsQuery(q: Q) {
  return q('quiet_windows as w')
    .leftJoin('sketches as sk', 'sk.id', 'w.sketch_id')
    .leftJoin('services as sv', 'sv.id', q.raw('coalesce(w.service_id, sk.service_id)'))
    .leftJoin('teams as t', 't.id', q.raw('coalesce(w.team_id, sv.team_id)'))
    .select('w.*', 'sk.name as sketch', 'sv.name as service', 't.slug as team', 't.name as team_name');
}

export async function listQuietWindows(db: Db, filter: { when: 'active' | 'past' | 'all'; team?: string }, now: Date): Promise<{ quietWindows: QuietWindow[] }> {
  const query = windowsQuery(db).orderBy([{ column: 'w.starts_at' }, { column: 'w.id' }]).limit(500);
  if (filter.when === 'active') query.whereNull('w.cancelled_at').where('w.ends_at', '>', now);
  if (filter.when === 'past') query.where((w) => w.whereNotNull('w.cancelled_at').orWhere('w.ends_at', '<=', now));
  if (filter.team !== undefined) query.where('t.id', await teamIdOf(db, filter.team));
  return { quietWindows: (await query).map((r: Record<string, unknown>) => viewOf(r, now)) };
}

async function targetOf(db: Db, input: QuietWindowInput): Promise<Record<string, number>> {
  if (input.scope === 'sketch') {
    const sketch = input.sketchId === undefined ? undefined : await db('sketches').where({ id: input.sketchId }).first('id');
    if (!sketch) throw new AppError(400, 'unknown_sketch', `There is no sketch with id ${input.sketchId}; GET /api/v1/sketches lists them.`, 'sketchId');
    return { sketch_id: Number(sketch.id) };
  }
  if (input.scope === 'service') {
    const service = input.service === undefined ? undefined : await db('services').where({ name: input.service }).first('id');
    if (!service) throw new AppError(400, 'unknown_service', `There is no service named '${input.service}'; use a name from the Fleet page.`, 'service');
    return { service_id: Number(service.id) };
  }
  return { team_id: await teamIdOf(db, input.team as string) };
}

function checkTimes(startsAt: Date, endsAt: Date, now: Date): void {
  if (endsAt <= startsAt) {
    throw new AppError(400, 'invalid', `endsAt (${endsAt.toISOString()}) must be after startsAt (${startsAt.toISOString()}); a quiet window ends after it starts.`, 'endsAt');
  }
  if (endsAt <= now) throw new AppError(400, 'invalid', `endsAt (${endsAt.toISOString()}) is already past; set an end in the future.`, 'endsAt');
  if (endsAt.getTime() - startsAt.getTime() > MAX_QUIET_DAYS * DAY_MS) {
    throw new AppError(400, 'invalid', `A quiet window may last at most ${MAX_QUIET_DAYS} days; set an earlier endsAt, and set another window later if the work runs on.`, 'endsAt');
  }
}

export async function createQuietWindow(db: Db, caller: Caller, input: QuietWindowInput, now: Date): Promise<QuietWindow> {
  const startsAt = input.startsAt ?? now;
  checkTimes(startsAt, input.endsAt, now);
  const target = await targetOf(db, input);
  return db.transaction(async (trx) => {
    const [row] = await trx('quiet_windows')
      .insert({ scope: input.scope, ...target, starts_at: startsAt, ends_at: input.endsAt, reason: input.reason, created_by: caller.id, created_by_login: caller.login, created_at: now })
      .returning('id');
    const view = viewOf(await windowsQuery(trx).where('w.id', row.id).first(), now);
    await recordAudit(trx, { actor: caller, action: 'quiet_window.created', subjectType: 'quiet_window', subjectId: view.id, after: view });
    return view;
  });
}

/** Ends a window now (or calls off one not yet begun); the row stays, so who quieted what stays on record. */
export async function endQuietWindow(db: Db, caller: Caller, id: number, now: Date): Promise<QuietWindow> {
  return db.transaction(async (trx) => {
    const row = await trx('quiet_windows').where({ id }).forUpdate().first();
    if (!row) throw new AppError(404, 'quiet_window_not_found', `There is no quiet window with id ${id}; GET /api/v1/quiet-windows lists them.`, 'id');
    const before = viewOf(await windowsQuery(trx).where('w.id', id).first(), now);
    if (before.status === 'ended early' || before.status === 'over') {
      throw new AppError(409, 'quiet_window_over', `Quiet window ${id} is already over (${before.status}, ${before.cancelledAt ?? before.endsAt}); nothing changed.`);
    }
    await trx('quiet_windows').where({ id }).update({ cancelled_at: now, cancelled_by_login: caller.login });
    const after = viewOf(await windowsQuery(trx).where('w.id', id).first(), now);
    await recordAudit(trx, { actor: caller, action: 'quiet_window.ended', subjectType: 'quiet_window', subjectId: id, before, after });
    return after;
  });
}
