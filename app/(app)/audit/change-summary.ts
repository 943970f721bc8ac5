// Pure and client-safe: the audit grid turns an event's before/after into one readable line.

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

function show(value: unknown): string {
  if (value === null || value === undefined) return '—';
  if (Array.isArray(value)) return value.length ? value.map(show).join(', ') : 'none';
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

/**
 * What an audit event changed, field by field: `roles: biologist → approver, biologist`. A creation
 * lists what was set, a removal what was there; fields that stayed the same are left out.
 */
export function changeSummary(before: unknown, after: unknown): string {
  if (isRecord(before) && isRecord(after)) {
    const keys = [...new Set([...Object.keys(before), ...Object.keys(after)])].sort();
    const changed = keys.filter((key) => JSON.stringify(before[key]) !== JSON.stringify(after[key]));
    return changed.length
      ? changed.map((key) => `${key}: ${show(before[key])} → ${show(after[key])}`).join('; ')
      : 'no field changed';
  }
  if (isRecord(after) && (before === null || before === undefined)) {
    return Object.keys(after)
      .sort()
      .map((key) => `${key}: ${show(after[key])}`)
      .join('; ');
  }
  if (isRecord(before) && (after === null || after === undefined)) {
    return `removed: ${Object.keys(before)
      .sort()
      .map((key) => `${key}: ${show(before[key])}`)
      .join('; ')}`;
  }
  if (before === null || before === undefined)
    return after === null || after === undefined ? '—' : show(after);
  return `${show(before)} → ${show(after)}`;
}
