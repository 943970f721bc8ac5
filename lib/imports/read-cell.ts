import 'server-only';
import type { Cell } from './spreadsheet-types';
import { parseUnit, toCanonical, UNIT_LABEL, unitsOf, type QuantityKind, type Unit } from './units';

/** Written forms that mean "no value" in an export; matched after trimming, ignoring case. */
export const MISSING_MARKERS = ['', '-', '--', '—', '–', 'na', 'n/a', 'nd', 'none', 'null', '#n/a'];

const NOT_FINITE = new Set([
  'nan',
  'inf',
  '+inf',
  '-inf',
  'infinity',
  '+infinity',
  '-infinity',
  '∞',
  '+∞',
  '-∞',
]);
const NO_WORDS: ReadonlySet<string> = new Set();
const NUMBER_WITH_UNIT = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(\S.*)?$/;

/** A quantity read from a cell: canonical value (null when missing), or why it cannot be read. */
export type QuantityResult =
  | { ok: true; value: number | null }
  | { ok: false; code: 'not_numeric' | 'not_finite' | 'unknown_unit'; detail: string };

/** Text of a cell for identifiers and names: trimmed, numbers written out; null when blank or a missing marker. */
export function readText(cell: Cell | undefined): string | null {
  if (cell === null || cell === undefined) return null;
  const text = typeof cell === 'string' ? cell.trim() : String(cell);
  return MISSING_MARKERS.includes(text.toLowerCase()) ? null : text;
}

/**
 * Reads a number in `unit` (or in the unit written after it, "300 nM") and converts it to the
 * canonical unit of `kind`. With `decimalComma`, "1,5" reads as 1.5.
 */
export function readQuantity(
  cell: Cell | undefined,
  kind: QuantityKind,
  unit: Unit,
  decimalComma = false,
  /** More written forms (lower case) that mean "no value" in this file, such as "nan". */
  missing: ReadonlySet<string> = NO_WORDS,
): QuantityResult {
  if (cell === null || cell === undefined) return { ok: true, value: null };
  if (typeof cell === 'number')
    return Number.isFinite(cell)
      ? { ok: true, value: toCanonical(cell, unit, kind) }
      : Number.isNaN(cell) && missing.has('nan')
        ? { ok: true, value: null }
        : notFinite(String(cell));
  if (typeof cell === 'boolean')
    return { ok: false, code: 'not_numeric', detail: `${cell ? 'TRUE' : 'FALSE'} is not a number` };
  const text = cell.trim();
  if (MISSING_MARKERS.includes(text.toLowerCase()) || missing.has(text.toLowerCase()))
    return { ok: true, value: null };
  if (NOT_FINITE.has(text.toLowerCase())) return notFinite(text);
  const written =
    decimalComma && /^[+-]?\d+,\d+/.test(text) && !text.includes('.') ? text.replace(',', '.') : text;
  const match = written.length <= 64 ? NUMBER_WITH_UNIT.exec(written) : null;
  if (!match) return { ok: false, code: 'not_numeric', detail: `"${shorten(text)}" is not a number` };
  const value = Number(match[1]);
  if (!Number.isFinite(value)) return notFinite(text);
  const suffix = match[2];
  if (suffix === undefined) return { ok: true, value: toCanonical(value, unit, kind) };
  if (!/^[A-Za-z\u00b5\u03bc\u03a9\u2126([]/.test(suffix))
    return { ok: false, code: 'not_numeric', detail: `"${shorten(text)}" is not a number` };
  const inlineUnit = parseUnit(suffix, kind);
  if (inlineUnit) return { ok: true, value: toCanonical(value, inlineUnit, kind) };
  const accepted = unitsOf(kind)
    .map((u) => UNIT_LABEL[u])
    .join(', ');
  return {
    ok: false,
    code: 'unknown_unit',
    detail: `"${shorten(text)}" has the unit "${shorten(suffix)}", which is not one of ${accepted}`,
  };
}

function notFinite(text: string): QuantityResult {
  return { ok: false, code: 'not_finite', detail: `"${shorten(text)}" is not a finite number` };
}

/** A value as it may be quoted in a message: at most 40 characters. */
export function shorten(text: string): string {
  return text.length > 40 ? `${text.slice(0, 39)}…` : text;
}
