import type { DumpFigures, DumpFormat, DumpHead, DumpList, DumpReport } from '../../api-types';
import type { Caller } from '../../auth/caller';
import { recordAudit } from '../../audit/record';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { findDumpReport, insertDumpReport, listDumpReports, type DumpReportRow } from '../../queries/dump-reports';
import type { DumpResult } from './dump-reader';
import type { ResolvedDump } from './dump-settings';
import { dumpFigures } from './report';

function headOf(row: DumpReportRow): DumpHead {
  return {
    id: Number(row.id),
    createdAt: new Date(row.created_at).toISOString(),
    uploadedBy: row.user_login,
    sketch: row.sketch_id === null || row.sketch === null ? null : { id: Number(row.sketch_id), service: row.service!, sketch: row.sketch, team: row.team! },
    fileName: row.file_name,
    format: row.format as DumpFormat,
    byteSize: Number(row.byte_size),
  };
}

/** Keeps a checked dump's report, and records who checked what in the audit log. */
export async function saveDumpReport(db: Db, user: Caller, upload: { fileName: string; resolved: ResolvedDump; result: DumpResult }): Promise<DumpReport> {
  const figures = dumpFigures(upload.result);
  const id = await db.transaction(async (trx) => {
    const reportId = await insertDumpReport(trx, {
      userId: user.id,
      userLogin: user.login,
      sketchId: upload.resolved.sketch?.id ?? null,
      fileName: upload.fileName,
      format: upload.resolved.settings.format,
      byteSize: upload.result.byteSize,
      width: figures.width,
      depth: figures.depth,
      level: figures.level,
      report: figures,
    });
    await recordAudit(trx, {
      actor: user,
      action: 'dump.checked',
      subjectType: 'dump_report',
      subjectId: reportId,
      after: { fileName: upload.fileName, sketchId: upload.resolved.sketch?.id ?? null, width: figures.width, depth: figures.depth, level: figures.level },
    });
    return reportId;
  });
  return dumpReport(db, id);
}

export async function dumpReport(db: Db, id: number): Promise<DumpReport> {
  const row = await findDumpReport(db, id);
  if (!row) throw new AppError(404, 'dump_report_not_found', `There is no dump report ${id}; GET /api/v1/dumps lists them.`, 'id');
  return { ...headOf(row), ...(row.report as unknown as DumpFigures) };
}

export async function listDumps(db: Db, q: { limit: number; before?: number; sketchId?: number }): Promise<DumpList> {
  const rows = await listDumpReports(db, q);
  const items = rows.map((row) => ({ ...headOf(row), width: row.width, depth: row.depth, level: row.level as DumpFigures['level'], load: Number(row.load) }));
  return { items, nextBefore: rows.length === q.limit ? items[items.length - 1].id : null };
}
