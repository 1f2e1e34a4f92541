import type { Figures, InstanceView, SketchDetail } from '../../api-types';
import type { Db } from '../../db';
import { severity } from '../../maths/health-levels';
import { AppError } from '../../http/errors';
import { findSketch, targetsWithStatus, type SketchRow } from '../../queries/sketches';
import { figuresOf, isoOrNull, type StatusRow } from './figures';
import { settingsView } from './fleet';
import { resizeAdvice } from './resize-advice';

/** An instance with its figures kept apart, so the worst one can be picked before they are spread into the answer. */
export type Instance = Omit<InstanceView, keyof Figures> & { figures: Figures };

/** The worst instance speaks for the sketch: highest severity, then highest load. */
function worstFirst(a: Instance, b: Instance): number {
  return severity(b.figures.level) - severity(a.figures.level) || (b.figures.load ?? -1) - (a.figures.load ?? -1) || a.targetId - b.targetId;
}

export async function loadInstances(db: Db, sketchId: number): Promise<Instance[]> {
  const rows = await targetsWithStatus(db, sketchId);
  return rows.map((row: StatusRow & { target_id: number; instance: string; url: string }) => ({
    targetId: Number(row.target_id),
    instance: row.instance,
    targetUrl: row.url,
    nonzeroCells: row.nonzero_cells ?? null,
    figures: figuresOf(row.level === null ? null : row),
  }));
}

export async function requireSketch(db: Db, id: number): Promise<SketchRow> {
  const row = await findSketch(db, id);
  if (!row) throw new AppError(404, 'sketch_not_found', `There is no sketch with id ${id}; it may have been deleted. GET /api/v1/sketches lists them.`, 'id');
  return row;
}

/** The sketch page: settings, the worst instance's figures, every instance, and the resize plan. */
export async function sketchDetail(db: Db, id: number, now: Date): Promise<SketchDetail> {
  const row = await requireSketch(db, id);
  const instances = await loadInstances(db, id);
  const worst = instances.slice().sort(worstFirst)[0];
  const settings = settingsView(row);
  return {
    ...settings,
    ...(worst?.figures ?? figuresOf(null)),
    targetUrl: instances[0]?.targetUrl ?? null,
    instances: instances.map(({ figures, ...rest }) => ({ ...rest, ...figures })),
    resizePlan: await resizeAdvice(db, settings, worst, now),
    createdAt: isoOrNull(row.created_at),
    updatedAt: isoOrNull(row.updated_at),
  };
}
