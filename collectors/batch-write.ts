import type { Knex } from 'knex';
import type { ReadingRows } from './reading-rows';

/** One finished scrape as the batch writer stores it: its rows and the slot its target moves to. */
export interface ScrapeToWrite {
  targetId: number;
  nextScrapeAt: Date;
  rows: ReadingRows;
}

/** Figures a good reading brings to target_status; a failed one keeps the last good figures. */
const FIGURES_OF_GOOD = ['last_ok_at', 'stream_total', 'width', 'depth', 'counter_bytes', 'window_seconds', 'conservative', 'nonzero_cells', 'judgement'];
/** What every reading, good or failed, sets in target_status. */
const ALWAYS = ['level', 'taken_at', 'last_error', 'failures_in_row', 'level_since'];

// A good reading always has last_ok_at (its own time) and a failed one never does, so it tells the two apart.
const statusUpdate = [
  ...ALWAYS.map((c) => `${c} = excluded.${c}`),
  ...FIGURES_OF_GOOD.map((c) => `${c} = case when excluded.last_ok_at is null then target_status.${c} else excluded.${c} end`),
].join(', ');

/**
 * The columns, one array each, of the statement's unnest(): the whole batch
 * travels as 20 parameters instead of one per value (several thousand for
 * 200 readings), which the server parses and plans once.
 */
const COLUMNS: [name: string, type: string, of: (s: ScrapeToWrite) => unknown][] = [
  ['target_id', 'bigint', (s) => s.targetId],
  ['next_at', 'timestamptz', (s) => s.nextScrapeAt.toISOString()],
  ['sketch_id', 'bigint', (s) => s.rows.reading.sketch_id],
  ['taken_at', 'timestamptz', (s) => (s.rows.reading.taken_at as Date).toISOString()],
  ['ok', 'boolean', (s) => s.rows.reading.ok],
  ['failure_reason', 'text', (s) => s.rows.reading.failure_reason],
  ['stream_total', 'float8', (s) => s.rows.reading.stream_total],
  ['width', 'integer', (s) => s.rows.reading.width],
  ['depth', 'integer', (s) => s.rows.reading.depth],
  ['counter_bytes', 'smallint', (s) => s.rows.reading.counter_bytes],
  ['window_seconds', 'integer', (s) => s.rows.reading.window_seconds],
  ['conservative', 'boolean', (s) => s.rows.reading.conservative],
  // An array per row cannot be an element of an array parameter: each travels as its own literal.
  ['nonzero_cells', 'text', (s) => (Array.isArray(s.rows.reading.nonzero_cells) ? `{${s.rows.reading.nonzero_cells.join(',')}}` : null)],
  ['scrape_ms', 'real', (s) => s.rows.reading.scrape_ms],
  ['is_reset', 'boolean', (s) => s.rows.reading.is_reset ?? false],
  ['is_resize', 'boolean', (s) => s.rows.reading.is_resize ?? false],
  ['reading_judgement', 'text', (s) => s.rows.reading.judgement],
  ['level', 'text', (s) => s.rows.status.level],
  ['failures_in_row', 'integer', (s) => s.rows.status.failures_in_row],
  ['level_since', 'timestamptz', (s) => (s.rows.status.level_since as Date).toISOString()],
  ['status_judgement', 'text', (s) => s.rows.status.judgement],
];

const SQL = `
  with v as (
    select * from unnest(${COLUMNS.map(([, type]) => `?::${type}[]`).join(', ')}) as v(${COLUMNS.map(([name]) => name).join(', ')})
  ), held as (
    update targets t set next_scrape_at = v.next_at, lease_owner = null, lease_expires_at = null
    from v where t.id = v.target_id and t.lease_owner = ?
    returning t.id
  ), stored as (
    insert into readings (target_id, sketch_id, taken_at, ok, failure_reason, stream_total, width, depth, counter_bytes,
                          window_seconds, conservative, nonzero_cells, scrape_ms, is_reset, is_resize, judgement)
    select v.target_id, v.sketch_id, v.taken_at, v.ok, v.failure_reason, v.stream_total, v.width, v.depth, v.counter_bytes,
           v.window_seconds, v.conservative, v.nonzero_cells::integer[], v.scrape_ms, v.is_reset, v.is_resize, v.reading_judgement::jsonb
    from v join held on held.id = v.target_id
  ), status as (
    insert into target_status (target_id, sketch_id, level, taken_at, last_ok_at, last_error, failures_in_row, stream_total, width, depth,
                               counter_bytes, window_seconds, conservative, nonzero_cells, judgement, level_since)
    select v.target_id, v.sketch_id, v.level, v.taken_at, case when v.ok then v.taken_at end, v.failure_reason, v.failures_in_row,
           v.stream_total, v.width, v.depth, v.counter_bytes, v.window_seconds, v.conservative, v.nonzero_cells::integer[],
           v.status_judgement::jsonb, v.level_since
    from v join held on held.id = v.target_id
    on conflict (target_id) do update set ${statusUpdate}
  )
  select id from held`;

/**
 * Writes a batch in one statement (one round trip): each target moves to its
 * next slot and its lease is freed, but only where `owner` still holds the
 * lease; for those targets alone the reading is inserted and target_status
 * upserted. A target whose lease expired and was claimed elsewhere is left
 * to that collector. Returns the ids still held, i.e. stored.
 */
export async function writeBatch(trx: Knex, owner: string, scrapes: ScrapeToWrite[]): Promise<Set<number>> {
  if (scrapes.length === 0) return new Set();
  // A failed reading has no figures: undefined becomes null (Knex refuses undefined bindings). Each array mixes values
  // and nulls, which pg sends as one array literal; Knex's binding types know only uniform arrays.
  const columns = COLUMNS.map(([, , of]) => scrapes.map((s) => of(s) ?? null) as unknown as Knex.Value);
  const { rows } = await trx.raw(SQL, [...columns, owner]);
  return new Set(rows.map((r: { id: number }) => Number(r.id)));
}
