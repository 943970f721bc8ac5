// Writes a demo export's sheets as xlsx bytes or as UTF-8 csv with a byte-order mark.
import XLSX from 'xlsx';
import type { Cell } from '@/lib/imports/spreadsheet-types';
import type { DemoExport } from './export-layouts';

/** The file bytes of an export; the extension of `file` picks xlsx or csv (csv holds the data sheet only). */
export function writeExport(file: string, exported: DemoExport): Uint8Array {
  if (file.endsWith('.csv')) {
    const sheet = exported.sheets.find((s) => s.name === exported.dataSheet);
    if (!sheet) throw new RangeError(`${file}: no sheet ${exported.dataSheet}`);
    return new TextEncoder().encode(`\ufeff${toCsv(sheet.rows)}`);
  }
  const book = XLSX.utils.book_new();
  for (const sheet of exported.sheets)
    XLSX.utils.book_append_sheet(book, XLSX.utils.aoa_to_sheet(sheet.rows), sheet.name);
  return new Uint8Array(
    XLSX.write(book, { type: 'array', bookType: 'xlsx', compression: true }) as ArrayBuffer,
  );
}

/** Comma-separated text with CRLF line ends; fields holding commas, quotes or line breaks are quoted. */
export function toCsv(rows: Cell[][]): string {
  const field = (cell: Cell) => {
    const text = cell === null ? '' : String(cell);
    return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
  };
  return rows.map((row) => row.map(field).join(',')).join('\r\n') + '\r\n';
}
