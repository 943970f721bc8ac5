import 'server-only';
// The block given directly in a column of its own: how it is written (a fraction or percent inhibition),
// guessed from its header or its values, and each cell read as a fraction.
import type { BlockScale } from './import-fields';
import { MISSING_MARKERS, shorten } from './read-cell';
import type { Cell } from './spreadsheet-types';

/** How a block column's header says its values are written: "% Inhibition" → percent; null when it does not say. */
export function blockScaleOfHeader(header: string): BlockScale | null {
  const text = header.toLowerCase();
  if (/%|percent|\bpct\b/.test(text)) return 'percent';
  if (/fraction|\(0\s*[-–]\s*1\)/.test(text)) return 'fraction';
  return null;
}

/** Beyond this magnitude no block is a fraction (twice full block, or twice the current's growth). */
const FRACTION_LIMIT = 2;

/**
 * The scale of a block column: the mapping's choice, else what its header says, else percent when any
 * value lies beyond ±2 (a fraction of block does not), else fraction.
 */
export function decideBlockScale(
  chosen: BlockScale | 'guess',
  header: string,
  cells: readonly (Cell | undefined)[],
  decimalComma: boolean,
): BlockScale {
  if (chosen !== 'guess') return chosen;
  const fromHeader = blockScaleOfHeader(header);
  if (fromHeader) return fromHeader;
  for (const cell of cells) {
    const read = readBlock(cell, 'fraction', decimalComma);
    if (read.ok && read.value !== null && Math.abs(read.value) > FRACTION_LIMIT) return 'percent';
    if (typeof cell === 'string' && /%\s*$/.test(cell)) return 'percent';
  }
  return 'fraction';
}

export type BlockResult =
  { ok: true; value: number | null } | { ok: false; code: 'not_numeric' | 'not_finite'; detail: string };

const NUMBER = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(%)?$/;

/**
 * A block cell as a fraction: a number in the column's scale ("50" in percent is 0.5), "50 %" as percent
 * whatever the scale; null for a blank cell or a missing marker (NA, NaN, n/a …).
 */
export function readBlock(
  cell: Cell | undefined,
  scale: BlockScale,
  decimalComma: boolean,
  /** More written forms (lower case) that mean "no value" in this file, such as "nan". */
  missing: ReadonlySet<string> = new Set(),
): BlockResult {
  if (cell === null || cell === undefined) return { ok: true, value: null };
  if (typeof cell === 'number' && Number.isNaN(cell) && missing.has('nan')) return { ok: true, value: null };
  if (typeof cell === 'boolean')
    return { ok: false, code: 'not_numeric', detail: `${cell ? 'TRUE' : 'FALSE'} is not a number` };
  if (typeof cell === 'number')
    return Number.isFinite(cell)
      ? { ok: true, value: scaled(cell, scale) }
      : { ok: false, code: 'not_finite', detail: `"${String(cell)}" is not a finite number` };
  const text = cell.trim();
  if (MISSING_MARKERS.includes(text.toLowerCase()) || missing.has(text.toLowerCase()))
    return { ok: true, value: null };
  const written =
    decimalComma && /^[+-]?\d+,\d+/.test(text) && !text.includes('.') ? text.replace(',', '.') : text;
  const match = written.length <= 64 ? NUMBER.exec(written) : null;
  if (!match) return { ok: false, code: 'not_numeric', detail: `"${shorten(text)}" is not a number` };
  const value = Number(match[1]);
  if (!Number.isFinite(value))
    return { ok: false, code: 'not_finite', detail: `"${shorten(text)}" is not a finite number` };
  return { ok: true, value: match[2] ? scaled(value, 'percent') : scaled(value, scale) };
}

function scaled(value: number, scale: BlockScale): number {
  return scale === 'percent' ? Number((value / 100).toPrecision(12)) : value;
}
