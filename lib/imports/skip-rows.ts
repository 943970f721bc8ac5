import 'server-only';
// Rows of a table that are not wells: a row of units right under the header ("mM", "nA", "MΩ") and
// summary rows (mean, count, SD …) that some exports write below or between the wells.
import { normaliseLabel } from './normalise-text';
import { parseWellPosition } from './plate-format';
import type { Cell } from './spreadsheet-types';
import { parseUnit, type QuantityKind } from './units';

const KINDS: QuantityKind[] = ['concentration', 'current', 'sealResistance', 'capacitance'];

/** Words that are not a quantity's unit but mark a column's scale in a row of units. */
const SCALE_WORDS = new Set(['%', 'percent', 'fraction', 'ratio', '#', 'no', 'count', 'text', '-']);

/** Whether a cell's text is a unit, in brackets or not ("mM", "[nA]", "MΩ", "%"). */
export function isUnitText(text: string): boolean {
  const bare = text.trim().replace(/^[([{]\s*|\s*[)\]}]$/g, '');
  if (bare === '') return false;
  return SCALE_WORDS.has(bare.toLowerCase()) || KINDS.some((kind) => parseUnit(bare, kind) !== null);
}

/** A row of units: at least one filled cell, every filled cell a unit written as text. */
export function isUnitsRow(cells: readonly Cell[]): boolean {
  const filled = cells.filter((cell) => cell !== null && !(typeof cell === 'string' && cell.trim() === ''));
  return filled.length > 0 && filled.every((cell) => typeof cell === 'string' && isUnitText(cell));
}

/** Words that open a summary row, normalised (lower case, letters and digits only). */
export const SUMMARY_WORDS: readonly string[] = [
  'mean',
  'average',
  'avg',
  'median',
  'count',
  'n',
  'total',
  'sum',
  'sd',
  'stdev',
  'std',
  'stddev',
  'standarddeviation',
  'sem',
  'se',
  'cv',
  'min',
  'max',
  'minimum',
  'maximum',
  'variance',
  'var',
  'summary',
];

/**
 * A summary row: its well cell names no well (blank, or not a position like A1 or a running number)
 * and its first filled cell is a summary word (SUMMARY_WORDS or one of `extraWords`, compared without
 * case, spaces or punctuation).
 */
export function isSummaryRow(
  cells: readonly Cell[],
  wellIndex: number | null,
  extraWords: readonly string[] = [],
): boolean {
  const well = wellIndex === null ? null : cells[wellIndex];
  if (typeof well === 'number') return false;
  if (typeof well === 'string' && (parseWellPosition(well) !== null || /^\s*\d+\s*$/.test(well)))
    return false;
  const first = cells.find((cell) => cell !== null && !(typeof cell === 'string' && cell.trim() === ''));
  if (typeof first !== 'string') return false;
  const word = normaliseLabel(first);
  return SUMMARY_WORDS.includes(word) || extraWords.some((extra) => normaliseLabel(extra) === word);
}
