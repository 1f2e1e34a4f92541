import type { SketchTimeline } from '../../api-types';
import type { Db } from '../../db';
import { historySketches, type HistoryFilter } from '../../queries/history-sketches';
import { csvRecord } from '../csv/csv-write';
import { timelinesOf, type HistoryPeriod } from './history';

export const HISTORY_CSV_HEADER = ['sketch_id', 'service', 'sketch', 'team', 'record', 'level', 'start', 'end', 'seconds', 'alert_event', 'actor', 'note'];

const BATCH = 100;

/**
 * Per sketch: one `level` row per span at a level, one `alert` row per alert
 * event, and one `total` row per level it spent time at over the period.
 */
function recordsOf(t: SketchTimeline): string[] {
  const who = [t.id, t.service, t.sketch, t.team];
  const rows: string[] = [];
  for (const s of t.spans) {
    if (s.level === null) continue;
    rows.push(csvRecord([...who, 'level', s.level, s.from, s.to, Math.round((Date.parse(s.to) - Date.parse(s.from)) / 1000), null, null, null]));
  }
  for (const a of t.alerts) rows.push(csvRecord([...who, 'alert', a.level, a.at, null, null, a.kind, a.actor, a.note]));
  for (const [level, seconds] of Object.entries(t.secondsAt)) {
    if (seconds > 0) rows.push(csvRecord([...who, 'total', level, null, null, Math.round(seconds), null, null, null]));
  }
  return rows;
}

/** Writes the whole history as CSV a hundred sketches at a time, so a large fleet never sits in memory at once. */
export async function writeHistoryCsv(db: Db, filter: HistoryFilter, period: HistoryPeriod, write: (chunk: string) => void): Promise<void> {
  write(csvRecord(HISTORY_CSV_HEADER));
  for (let offset = 0; ; offset += BATCH) {
    const { rows } = await historySketches(db, filter, offset, BATCH);
    if (rows.length === 0) return;
    const { timelines } = await timelinesOf(db, rows, period);
    write(timelines.flatMap(recordsOf).join(''));
    if (rows.length < BATCH) return;
  }
}
