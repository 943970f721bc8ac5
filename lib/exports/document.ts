import 'server-only';
import * as XLSX from 'xlsx';

export type Cell = string | number | boolean | null;

/** One table of an export: a sheet of the workbook, or the body of a csv file. */
export interface ExportTable {
  /** Sheet name (at most 31 characters) and csv file suffix. */
  sheet: string;
  key: string;
  columns: string[];
  rows: Cell[][];
  /** A line above the table in the workbook (the csv carries it in its about lines). */
  note?: string;
}

/** An export: what it is, the caution, state and signatures ("about" lines), and its tables. */
export interface ExportDocument {
  about: [string, Cell][];
  tables: ExportTable[];
}

/** The first sheet of every workbook and the head of every csv file. */
export const ABOUT_SHEET = 'About this export';

/** An xlsx workbook: the about sheet, then one sheet per table, with column widths fitted to the text. */
export function workbookBytes(doc: ExportDocument): Buffer {
  const book = XLSX.utils.book_new();
  const add = (name: string, rows: Cell[][]) => {
    const sheet = XLSX.utils.aoa_to_sheet(rows);
    const widths = rows.reduce<number[]>(
      (w, row) => row.map((cell, i) => Math.max(w[i] ?? 8, Math.min(60, String(cell ?? '').length + 2))),
      [],
    );
    sheet['!cols'] = widths.map((wch) => ({ wch }));
    XLSX.utils.book_append_sheet(book, sheet, name.slice(0, 31));
  };
  add(ABOUT_SHEET, doc.about);
  for (const table of doc.tables)
    add(table.sheet, [...(table.note ? [[table.note], []] : []), table.columns, ...table.rows]);
  return XLSX.write(book, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer;
}

/**
 * A csv field: quoted when it holds a comma, quote or line break; text that a spreadsheet would read
 * as a formula (= + - @ at the start) is prefixed with an apostrophe (common practice, no standard).
 */
function field(cell: Cell): string {
  if (cell === null) return '';
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
  if (typeof cell === 'boolean') return cell ? 'yes' : 'no';
  const text = /^[=+\-@\t\r]/.test(cell) ? `'${cell}` : cell;
  return /[",\r\n]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

const line = (cells: Cell[]) => cells.map(field).join(',');

/** One table as csv (RFC 4180, CRLF): the about lines, an empty line, then the table with its header. */
export function csvText(doc: ExportDocument, table: ExportTable): string {
  const lines = [...doc.about.map(line), '', line(table.columns), ...table.rows.map(line)];
  // The byte order mark makes spreadsheet programs read the file as UTF-8 (µM, GΩ).
  return `\uFEFF${lines.join('\r\n')}\r\n`;
}
