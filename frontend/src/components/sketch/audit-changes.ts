// One line saying what an audit entry changed, from its before and after snapshots.

function isRecord(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

const shown = (value: unknown) => (typeof value === 'string' ? value : JSON.stringify(value));

export function changedFields(before: unknown, after: unknown): string {
  if (!isRecord(before) && !isRecord(after)) return '';
  if (!isRecord(before)) return 'registered';
  if (!isRecord(after)) return 'deleted';
  const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])];
  const changes = keys
    .filter((key) => JSON.stringify(before[key]) !== JSON.stringify(after[key]))
    .map((key) => `${key}: ${shown(before[key])} → ${shown(after[key])}`);
  return changes.join('; ') || 'no field changed';
}
