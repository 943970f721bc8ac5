// Plate formats and well positions: A1, A01 and a01 name the same well; rows run A–Z then AA–AF.
import { PLATE_FORMAT_SIZE, PLATE_FORMATS, type PlateFormat } from '@/lib/domain/plate-formats';

/** A well on a plate: 0-based row and column indices and the canonical label ("B07"). */
export interface WellPosition {
  rowIndex: number;
  columnIndex: number;
  label: string;
}

/** Reads "A1", "A01", "a01", "B-7" or "AF48"; null when the text is not a well position. */
export function parseWellPosition(text: string): WellPosition | null {
  const match = /^([A-Za-z]{1,2})[\s_-]?(\d{1,3})$/.exec(text.trim());
  if (!match) return null;
  const letters = (match[1] ?? '').toUpperCase();
  const column = Number(match[2]);
  if (column < 1) return null;
  const rowIndex =
    letters.length === 1
      ? letters.charCodeAt(0) - 65
      : (letters.charCodeAt(0) - 64) * 26 + letters.charCodeAt(1) - 65;
  return { rowIndex, columnIndex: column - 1, label: wellLabel(rowIndex, column - 1) };
}

/** The canonical label of a well: row letters and a two-digit column ("A01", "P24", "AF48"). */
export function wellLabel(rowIndex: number, columnIndex: number): string {
  return `${rowLetters(rowIndex)}${String(columnIndex + 1).padStart(2, '0')}`;
}

/** Row letters for a 0-based row index: 0 → A, 25 → Z, 26 → AA. */
export function rowLetters(rowIndex: number): string {
  return rowIndex < 26
    ? String.fromCharCode(65 + rowIndex)
    : rowLetters(Math.floor(rowIndex / 26) - 1) + String.fromCharCode(65 + (rowIndex % 26));
}

/** Whether a well lies on a plate of the given format. */
export function fitsFormat(position: WellPosition, format: PlateFormat): boolean {
  const size = PLATE_FORMAT_SIZE[format];
  return position.rowIndex < size.rows && position.columnIndex < size.columns;
}

/** The smallest format holding every position, or null when one lies beyond a 1536-well plate. */
export function inferPlateFormat(positions: Iterable<WellPosition>): PlateFormat | null {
  let rows = 0;
  let columns = 0;
  for (const position of positions) {
    rows = Math.max(rows, position.rowIndex + 1);
    columns = Math.max(columns, position.columnIndex + 1);
  }
  return (
    PLATE_FORMATS.find(
      (format) => PLATE_FORMAT_SIZE[format].rows >= rows && PLATE_FORMAT_SIZE[format].columns >= columns,
    ) ?? null
  );
}

/** "a 384-well plate (rows A–P, columns 1–24)". */
export function describeFormat(format: PlateFormat): string {
  const size = PLATE_FORMAT_SIZE[format];
  return `a ${format}-well plate (rows A–${rowLetters(size.rows - 1)}, columns 1–${size.columns})`;
}

/** The well of a running number along the rows (A1 = 1, A2 = 2 …, B1 = columns + 1); null beyond the plate. */
export function wellFromIndex(index: number, format: PlateFormat): WellPosition | null {
  const { rows, columns } = PLATE_FORMAT_SIZE[format];
  if (!Number.isInteger(index) || index < 1 || index > rows * columns) return null;
  const rowIndex = Math.floor((index - 1) / columns);
  const columnIndex = (index - 1) % columns;
  return { rowIndex, columnIndex, label: wellLabel(rowIndex, columnIndex) };
}

/** The smallest format with at least `count` wells, or null beyond 1536. */
export function formatForWellCount(count: number): PlateFormat | null {
  return PLATE_FORMATS.find((f) => PLATE_FORMAT_SIZE[f].rows * PLATE_FORMAT_SIZE[f].columns >= count) ?? null;
}
