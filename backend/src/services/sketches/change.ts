import type { Caller } from '../../auth/caller';
import { assertTeamAccess } from '../../auth/team-access';
import { recordAudit } from '../../audit/record';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { deleteSketch, deleteTargets, findSketch, insertTargets, sketchExists, updateSketch, updateTargetUrl, type SketchSettings } from '../../queries/sketches';
import type { ChangeInput } from '../../routes/sketch-input';
import { requireSketch } from './detail';
import { duplicate } from './register';
import { isUniqueViolation, sketchSnapshot } from './snapshot';
import { checkTargetUrls, type TargetPolicy } from './target-check';

type Target = { id: number; instance: string; url: string };

/** Which targets to add, re-address or remove so the sketch has exactly the listed replicas; history stays with a kept name. */
function targetPlan(current: Target[], input: ChangeInput) {
  if (input.instances && input.targetUrl !== undefined) {
    throw new AppError(400, 'invalid', 'Send either targetUrl (a sketch with one instance) or instances (the full list of replicas), not both.', 'targetUrl');
  }
  if (input.targetUrl !== undefined) {
    if (current.length !== 1) {
      throw new AppError(400, 'invalid', `targetUrl changes the address of a sketch with one instance; this one has ${current.length}: send instances with the full list instead.`, 'targetUrl');
    }
    return { add: [], readdress: current[0].url === input.targetUrl ? [] : [{ id: current[0].id, url: input.targetUrl }], remove: [] };
  }
  if (!input.instances) return { add: [], readdress: [], remove: [] };
  const wanted = new Map(input.instances.map((i) => [i.instance, i.targetUrl]));
  const byName = new Map(current.map((t) => [t.instance, t]));
  return {
    add: input.instances.filter((i) => !byName.has(i.instance)).map((i) => ({ instance: i.instance, url: i.targetUrl })),
    readdress: current.filter((t) => wanted.has(t.instance) && wanted.get(t.instance) !== t.url).map((t) => ({ id: t.id, url: wanted.get(t.instance) as string })),
    remove: current.filter((t) => !wanted.has(t.instance)).map((t) => t.id),
  };
}

function settingsChange(input: ChangeInput): Partial<SketchSettings> {
  const change: Partial<SketchSettings> = {};
  if (input.sketch !== undefined) change.name = input.sketch;
  if (input.errorBudget !== undefined) change.error_budget = input.errorBudget;
  if (input.confidence !== undefined) change.confidence = input.confidence;
  if (input.watchLine !== undefined) change.watch_line = input.watchLine;
  if (input.leadTimeDays !== undefined) change.lead_time_days = input.leadTimeDays;
  if (input.scrapeIntervalSeconds !== undefined) change.scrape_interval_seconds = input.scrapeIntervalSeconds;
  if (input.sizedTotal !== undefined) change.sized_total = input.sizedTotal;
  return change;
}

/** PATCH: changes settings and targets in one transaction, audited with the sketch before and after. */
export async function changeSketch(db: Db, user: Caller, id: number, input: ChangeInput, policy: TargetPolicy): Promise<void> {
  const existing = await requireSketch(db, id);
  assertTeamAccess(user, existing.team_id, 'change this sketch');
  const addresses = input.instances?.map((i) => i.targetUrl) ?? (input.targetUrl === undefined ? [] : [input.targetUrl]);
  await checkTargetUrls(addresses, input.instances !== undefined, policy);
  try {
    await db.transaction(async (trx) => {
      const row = await findSketch(trx, id, { forUpdate: true });
      if (!row) throw new AppError(404, 'sketch_not_found', `There is no sketch with id ${id}; it was deleted meanwhile.`, 'id');
      if (input.sketch !== undefined && (await sketchExists(trx, row.service_id, input.sketch, id))) throw duplicate(row.service, input.sketch);
      const before = await sketchSnapshot(trx, id);
      const current: Target[] = (await trx('targets').where({ sketch_id: id }).select('id', 'instance', 'url')).map((t: Target) => ({ ...t, id: Number(t.id) }));
      const plan = targetPlan(current, input);
      await updateSketch(trx, id, settingsChange(input));
      await deleteTargets(trx, plan.remove);
      for (const t of plan.readdress) await updateTargetUrl(trx, t.id, t.url);
      await insertTargets(trx, id, plan.add);
      await recordAudit(trx, { actor: user, action: 'sketch.updated', subjectType: 'sketch', subjectId: id, before, after: await sketchSnapshot(trx, id) });
    });
  } catch (err) {
    if (isUniqueViolation(err)) throw duplicate(existing.service, input.sketch ?? existing.name);
    throw err;
  }
}

/** DELETE: the sketch, its targets and its readings go; the audit log keeps what it was. */
export async function removeSketch(db: Db, user: Caller, id: number): Promise<void> {
  const existing = await requireSketch(db, id);
  assertTeamAccess(user, existing.team_id, 'delete this sketch');
  await db.transaction(async (trx) => {
    const before = await sketchSnapshot(trx, id);
    if (!before) return;
    await deleteSketch(trx, id);
    await recordAudit(trx, { actor: user, action: 'sketch.deleted', subjectType: 'sketch', subjectId: id, before });
  });
}
