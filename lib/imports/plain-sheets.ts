import 'server-only';
import type { Cell, SheetData } from './spreadsheet-types';

/** Checks that what came back from the parse worker is sheets of plain cells, and copies it; null if not. */
export function checkPlainSheets(value: unknown): SheetData[] | null {
  if (!Array.isArray(value)) return null;
  const sheets: SheetData[] = [];
  for (const sheet of value as unknown[]) {
    if (!sheet || typeof sheet !== 'object') return null;
    const { name, rows, decimalComma } = sheet as Record<string, unknown>;
    if (typeof name !== 'string' || typeof decimalComma !== 'boolean' || !Array.isArray(rows)) return null;
    const copied: Cell[][] = [];
    for (const row of rows as unknown[]) {
      if (!Array.isArray(row)) return null;
      const cells: Cell[] = [];
      for (const cell of row as unknown[]) {
        if (!isPlainCell(cell)) return null;
        cells.push(cell);
      }
      copied.push(cells);
    }
    sheets.push({ name, rows: copied, decimalComma });
  }
  return sheets;
}

function isPlainCell(cell: unknown): cell is Cell {
  return (
    cell === null ||
    typeof cell === 'string' ||
    typeof cell === 'boolean' ||
    (typeof cell === 'number' && Number.isFinite(cell))
  );
}
