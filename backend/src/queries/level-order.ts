import { HEALTH_LEVELS_WORST_FIRST, severity } from '../maths/health-levels';

/**
 * The maths module's severity order as a SQL expression, so the database can
 * sort and pick the worst instance by the same order the rest of Brimwatch uses.
 * The levels are our own constants, never caller input, so inlining them is safe.
 */
export function severitySql(levelColumn: string): string {
  const arms = HEALTH_LEVELS_WORST_FIRST.map((level) => `when '${level}' then ${severity(level)}`).join(' ');
  return `(case ${levelColumn} ${arms} end)`;
}

/** A target that has no status row yet has not been read: the table's own default says stale. */
export const UNREAD_LEVEL = 'stale';
