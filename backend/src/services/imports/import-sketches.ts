import type { ImportPreview, ImportSummary, RowVerdict } from '../../api-types';
import type { Caller } from '../../auth/caller';
import { recordAudit } from '../../audit/record';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { registerSketch } from '../sketches/register';
import type { TargetPolicy } from '../sketches/target-check';
import { inventoryRows } from './inventory-rows';
import { checkRows, type CheckedRow } from './row-checks';

const text = (v: unknown) => (typeof v === 'string' ? v : null);

function verdictOf(row: CheckedRow): RowVerdict {
  const instances = Array.isArray(row.input.instances) ? (row.input.instances as { instance: string }[]).map((i) => i.instance).join(' ') : null;
  return {
    line: row.line,
    service: text(row.input.service),
    sketch: text(row.input.sketch),
    team: text(row.input.team),
    targets: instances ?? text(row.input.targetUrl),
    newService: row.newService,
    ok: row.problems.length === 0,
    problems: row.problems,
  };
}

/** What an import of this file would do, row by row; nothing is written. */
export async function previewImport(db: Db, user: Caller, bytes: Uint8Array, policy: TargetPolicy): Promise<ImportPreview> {
  const rows = (await checkRows(db, user, inventoryRows(bytes), policy)).map(verdictOf);
  const ready = rows.filter((r) => r.ok).length;
  return { rows, ready, withProblems: rows.length - ready };
}

/** Refused imports carry the per-row verdicts, so the page can show them beside the rows. */
export class ImportRefused extends AppError {
  constructor(status: number, code: string, message: string, readonly preview: ImportPreview) {
    super(status, code, message, 'file');
  }
}

function refusal(preview: ImportPreview): ImportRefused {
  const forbidden = preview.rows.some((r) => r.problems.some((p) => p.status === 403));
  const lines = preview.rows.filter((r) => !r.ok).map((r) => r.line);
  const where = `line${lines.length === 1 ? '' : 's'} ${lines.slice(0, 10).join(', ')}${lines.length > 10 ? ', …' : ''}`;
  return forbidden
    ? new ImportRefused(403, 'not_your_team', `Nothing was imported: ${where} name a team you do not own; owners import only for their own teams.`, preview)
    : new ImportRefused(400, 'import_invalid', `Nothing was imported: ${where} ${lines.length === 1 ? 'has a problem' : 'have problems'}; fix them and upload the file again.`, preview);
}

/**
 * All or nothing: every row is checked first; then every sketch is registered
 * by the same code as a single registration, inside one transaction, so a row
 * that fails at the last moment (a name taken meanwhile) undoes them all.
 */
export async function importSketches(db: Db, user: Caller, bytes: Uint8Array, fileName: string, policy: TargetPolicy): Promise<ImportSummary> {
  const checked = await checkRows(db, user, inventoryRows(bytes), policy);
  const preview = { rows: checked.map(verdictOf), ready: 0, withProblems: 0 };
  preview.ready = preview.rows.filter((r) => r.ok).length;
  preview.withProblems = preview.rows.length - preview.ready;
  if (preview.withProblems > 0) throw refusal(preview);

  let current: CheckedRow | undefined;
  try {
    return await db.transaction(async (trx) => {
      const summary: ImportSummary = { imported: 0, servicesCreated: [], sketches: [] };
      for (const row of checked) {
        current = row;
        const input = row.registration!;
        const id = await registerSketch(trx, user, input, policy);
        summary.sketches.push({ line: row.line, id, service: input.service, sketch: input.sketch, team: input.team });
        if (row.newService && !summary.servicesCreated.includes(input.service)) summary.servicesCreated.push(input.service);
      }
      summary.imported = summary.sketches.length;
      await recordAudit(trx, { actor: user, action: 'sketches.imported', subjectType: 'inventory', subjectId: fileName, after: { fileName, ...summary } });
      return summary;
    });
  } catch (error) {
    if (!(error instanceof AppError) || !current || error instanceof ImportRefused) throw error;
    const failed = current;
    failed.problems.push({ field: error.field, code: error.code, status: error.status, message: error.message });
    throw refusal({ rows: checked.map(verdictOf), ready: checked.length - 1, withProblems: 1 });
  }
}
