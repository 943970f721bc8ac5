import 'server-only';
// The reshape step (issue 18): a sheet laid out wide (a column block per target) or as plate-shaped grids
// (a block per readout) is read as the long table the rest of the import knows, a header row and one
// row per well and target, so that the mapping, units, value maps, QC and facts work unchanged. Every
// cell of that table remembers the cell of the file it came from, so issues name the file's own cells.
import { PLATE_FORMAT_SIZE, PLATE_FORMATS } from '@/lib/domain/plate-formats';
import { describeLocation, makeIssue, type ImportIssue } from './import-issue';
import type { ColumnMapping, SheetLayout } from './mapping-schema';
import { columnLetter, normaliseLabel } from './normalise-text';
import { keyValuePairs } from './plate-facts';
import { rowLetters, wellLabel } from './plate-format';
import { readText, shorten } from './read-cell';
import { isUnitsRow } from './skip-rows';
import type { Cell, SheetData } from './spreadsheet-types';

/** The header of the table's column holding the target of a wide sheet's block. */
export const WIDE_TARGET_HEADER = 'Target';
/** The header of the table's column holding a grid cell's well. */
export const GRID_WELL_HEADER = 'Well';

/** Where a cell of the table was read from: a cell of the file, and for grids its block and well. */
export interface CellSource {
  /** 1-based row as the spreadsheet shows it. */
  row: number;
  /** 0-based column. */
  column: number;
  /** The header the file writes above it (wide and constants), or the grid block's title. */
  header: string | null;
  /** A grid cell's well ("B5"); null elsewhere. */
  well: string | null;
}

/** A table read from a wide or grid sheet: its rows (header first) and where each cell came from. */
export interface ReshapedTable {
  kind: 'wide' | 'grid';
  sheet: SheetData;
  /** Parallel to `sheet.rows`: the source of each cell (null for cells the file does not hold). */
  sources: (CellSource | null)[][];
  /** Per table row (0 = header): the file's row it stands for (wide), or its well's row in the first grid. */
  homes: { row: number; well: string | null }[];
}

export type ReshapeResult = { ok: true; table: ReshapedTable } | { ok: false; issues: ImportIssue[] };

const SEPARATOR = /[\s_\-:./|]+/g;
const isBlankCell = (cell: Cell | undefined) =>
  cell === null || cell === undefined || (typeof cell === 'string' && cell.trim() === '');
const headerText = (cell: Cell | undefined) =>
  cell === null || cell === undefined ? '' : String(cell).trim();

/** Reads a wide or grid sheet as a long table; a long mapping gives the sheet back unchanged. */
export function reshapeSheet(
  sheet: SheetData,
  mapping: Pick<ColumnMapping, 'layout' | 'headerRow' | 'rows'>,
): ReshapeResult | null {
  const { layout } = mapping;
  if (layout.kind === 'wide')
    return readWide(sheet, mapping.headerRow, layout.targets, mapping.rows.unitsRow);
  if (layout.kind === 'grid') return readGrid(sheet, mapping.headerRow, layout.constants);
  return null;
}

/** The remainder of `header` after `prefix` and a separator ("SCN9A I0 (pA)" after "SCN9A" → "I0 (pA)"); null if it does not open with it. */
export function afterPrefix(header: string, prefix: string): string | null {
  const wanted = normaliseLabel(prefix);
  if (wanted === '') return null;
  for (const match of header.matchAll(SEPARATOR)) {
    const head = header.slice(0, match.index);
    if (normaliseLabel(head) === wanted) {
      const rest = header.slice(match.index + match[0].length).trim();
      return rest === '' ? null : rest;
    }
    if (normaliseLabel(head).length > wanted.length) break;
  }
  return null;
}

function problem(sheet: SheetData, detail: string, row: number | null = null, column: number | null = null) {
  const at = column === null ? null : { letter: columnLetter(column), header: null };
  return makeIssue({ code: 'unreadable_layout', sheet: sheet.name, row, column: at, detail });
}

// ---------------------------------------------------------------------------------------------- wide

function readWide(
  sheet: SheetData,
  headerRow: number,
  targets: readonly string[],
  unitsRow: 'guess' | 'yes' | 'no',
): ReshapeResult {
  const headers = (sheet.rows[headerRow - 1] ?? []).map(headerText);
  // Each target's block: its columns by the remainder of their header.
  const blocks = targets.map((target) => ({ target, columns: new Map<string, number>() }));
  const shared: number[] = [];
  const remainders: string[] = [];
  headers.forEach((header, index) => {
    if (header === '') return;
    for (const block of blocks) {
      const rest = afterPrefix(header, block.target);
      if (rest === null) continue;
      const key = normaliseLabel(rest);
      if (!remainders.some((r) => normaliseLabel(r) === key)) remainders.push(rest);
      if (!block.columns.has(key)) block.columns.set(key, index);
      return;
    }
    shared.push(index);
  });
  const issues: ImportIssue[] = [];
  for (const block of blocks) {
    if (block.columns.size === 0) {
      issues.push(
        problem(
          sheet,
          `no column of the header row opens with the target "${shorten(block.target)}" named in the mapping's column blocks.`,
          headerRow,
        ),
      );
      continue;
    }
    const lacking = remainders.filter((r) => !block.columns.has(normaliseLabel(r)));
    if (lacking.length > 0) {
      const other = blocks.find((b) => b !== block && lacking.every((r) => b.columns.has(normaliseLabel(r))));
      issues.push(
        problem(
          sheet,
          `the column block of "${shorten(block.target)}" has no ${lacking.map((r) => `"${shorten(r)}"`).join(', ')} column${other ? `, which the block of "${shorten(other.target)}" has` : ''}; every target's block needs the same columns.`,
          headerRow,
        ),
      );
    }
  }
  if (issues.length > 0) return { ok: false, issues };

  const header: Cell[] = [...shared.map((i) => headers[i]!), WIDE_TARGET_HEADER, ...remainders];
  const headerSources: (CellSource | null)[] = [
    ...shared.map((i) => ({ row: headerRow, column: i, header: headers[i]!, well: null })),
    null,
    ...remainders.map((r) => {
      const column = blocks[0]!.columns.get(normaliseLabel(r))!;
      return { row: headerRow, column, header: headers[column]!, well: null };
    }),
  ];
  const rows: Cell[][] = [header];
  const sources: (CellSource | null)[][] = [headerSources];
  const homes: ReshapedTable['homes'] = [{ row: headerRow, well: null }];
  const emit = (fileRow: number, cells: Cell[], block: (typeof blocks)[number] | null) => {
    const at = (column: number): CellSource => ({
      row: fileRow,
      column,
      header: headers[column] || null,
      well: null,
    });
    const first = block?.columns.values().next().value;
    rows.push([
      ...shared.map((i) => cells[i] ?? null),
      block ? block.target : null,
      ...remainders.map((r) => {
        const column = (block ?? blocks[0]!).columns.get(normaliseLabel(r))!;
        return cells[column] ?? null;
      }),
    ]);
    sources.push([
      ...shared.map(at),
      first === undefined ? null : { ...at(first), header: headers[first] ?? null },
      ...remainders.map((r) => at((block ?? blocks[0]!).columns.get(normaliseLabel(r))!)),
    ]);
    homes.push({ row: fileRow, well: null });
  };
  sheet.rows.forEach((cells, index) => {
    if (index < headerRow || cells.every(isBlankCell)) return;
    // A row of units under the header is given once, so that the long table skips it as such.
    const units = index === headerRow && unitsRow !== 'no' && (unitsRow === 'yes' || isUnitsRow(cells));
    if (units) return emit(index + 1, cells, null);
    for (const block of blocks) emit(index + 1, cells, block);
  });
  return { ok: true, table: { kind: 'wide', sheet: { ...sheet, rows }, sources, homes } };
}

/**
 * Target blocks of a wide header row: the prefixes (as the file writes them) shared by at least two
 * groups of headers whose remainders are the same readouts, where `isReadout` says which remainders name
 * a per-target readout and `isTarget` which prefixes may name a target. Empty when the row is not wide.
 */
export function findWideTargets(
  headerCells: readonly Cell[],
  isReadout: (rest: string) => boolean,
  isTarget: (prefix: string) => boolean,
): string[] {
  const headers = headerCells.map(headerText).filter((h) => h !== '');
  const groups = new Map<string, { prefix: string; rests: Set<string> }>();
  for (const header of headers) {
    for (const match of header.matchAll(SEPARATOR)) {
      const prefix = header.slice(0, match.index).trim();
      const rest = header.slice(match.index + match[0].length).trim();
      if (prefix === '' || rest === '' || !isReadout(rest) || !isTarget(prefix)) continue;
      const key = normaliseLabel(prefix);
      const group = groups.get(key) ?? { prefix, rests: new Set<string>() };
      group.rests.add(normaliseLabel(rest));
      groups.set(key, group);
      break;
    }
  }
  // The blocks are the prefixes whose readouts are the most common set, when two or more share it.
  const bySet = new Map<string, string[]>();
  for (const group of groups.values()) {
    const set = [...group.rests].sort().join('|');
    bySet.set(set, [...(bySet.get(set) ?? []), group.prefix]);
  }
  const best = [...bySet.values()].sort((a, b) => b.length - a.length)[0] ?? [];
  return best.length >= 2 ? best : [];
}

// ---------------------------------------------------------------------------------------------- grid

/** One plate-shaped block: its title, where its title sits and where well A1 sits (0-based), and its size. */
export interface GridBlock {
  title: string;
  titleRow: number;
  titleColumn: number;
  /** 0-based row and column of well A1. */
  top: number;
  left: number;
  rows: number;
  columns: number;
}

/**
 * The plate-shaped blocks of a sheet from row `from` (0-based) down: a row of column numbers 1, 2, …
 * with a title in the row above and row letters A, B, … down the column left of the numbers. Shapes are
 * not judged here; `problems` holds what keeps a block from being read (no title).
 */
export function findGridBlocks(
  sheet: SheetData,
  from = 0,
): { blocks: GridBlock[]; untitled: { row: number; column: number }[] } {
  const blocks: GridBlock[] = [];
  const untitled: { row: number; column: number }[] = [];
  for (let r = Math.max(from, 0); r < sheet.rows.length; r += 1) {
    const numbers = numberRun(sheet.rows[r] ?? []);
    if (!numbers) continue;
    const left = numbers.start;
    let rows = 0;
    while (readText(sheet.rows[r + 1 + rows]?.[left - 1])?.toUpperCase() === rowLetters(rows)) rows += 1;
    if (rows === 0) continue;
    const title = r - 1 >= from ? firstWritten(sheet.rows[r - 1] ?? []) : null;
    if (title === null) untitled.push({ row: r, column: left });
    else
      blocks.push({
        title: title.text,
        titleRow: r - 1,
        titleColumn: title.column,
        top: r + 1,
        left,
        rows,
        columns: numbers.count,
      });
    r += rows;
  }
  return { blocks, untitled };
}

/** The run of whole numbers 1, 2, 3, … in a row (at least two), from its first cell; null when there is none. */
function numberRun(cells: readonly Cell[]): { start: number; count: number } | null {
  const start = cells.findIndex((cell) => readText(cell) === '1');
  if (start < 1) return null;
  if (cells.slice(0, start).some((cell) => !isBlankCell(cell))) return null;
  let count = 0;
  while (readText(cells[start + count]) === String(count + 1)) count += 1;
  if (count < 2 || cells.slice(start + count).some((cell) => !isBlankCell(cell))) return null;
  return { start, count };
}

function firstWritten(cells: readonly Cell[]): { text: string; column: number } | null {
  const column = cells.findIndex((cell) => !isBlankCell(cell));
  return column < 0 ? null : { text: headerText(cells[column]), column };
}

const SHAPES = PLATE_FORMATS.map((format) => ({ format, ...PLATE_FORMAT_SIZE[format] }));
const describeShapes = SHAPES.map((s) => `${s.rows} × ${s.columns}`).join(', ');

function readGrid(sheet: SheetData, headerRow: number, constants: readonly string[]): ReshapeResult {
  const { blocks, untitled } = findGridBlocks(sheet, headerRow - 1);
  const issues: ImportIssue[] = untitled.map((at) =>
    problem(
      sheet,
      'a plate grid has column numbers here but no title in the row above; give every grid a title naming its readout.',
      at.row + 1,
      at.column,
    ),
  );
  if (blocks.length === 0 && issues.length === 0)
    issues.push(
      problem(
        sheet,
        `no plate grid was found from row ${headerRow} down: a grid is a title, a row of column numbers 1, 2, … and rows led by the letters A, B, ….`,
      ),
    );
  for (const block of blocks) {
    const where = `the grid "${shorten(block.title)}" (title in row ${block.titleRow + 1})`;
    if (!SHAPES.some((s) => s.rows === block.rows && s.columns === block.columns)) {
      const near = SHAPES.find((s) => s.columns === block.columns);
      const detail = near
        ? `${where} has rows A–${rowLetters(block.rows - 1)} under ${block.columns} columns; a grid of ${block.columns} columns has rows A–${rowLetters(near.rows - 1)}.`
        : `${where} is ${block.rows} × ${block.columns}; a plate grid is ${describeShapes} (rows × columns).`;
      issues.push(problem(sheet, detail, block.top + 1, block.left - 1));
      continue;
    }
    // Cells written right of the grid or in a row-letter row beyond it make its shape unclear.
    for (let r = 0; r < block.rows; r += 1) {
      const cells = sheet.rows[block.top + r] ?? [];
      const beyond = cells.findIndex((cell, c) => c >= block.left + block.columns && !isBlankCell(cell));
      if (beyond >= 0) {
        issues.push(
          problem(
            sheet,
            `${where} has a value beyond its column ${block.columns} in row ${rowLetters(r)}; a grid's rows end at its last column number.`,
            block.top + r + 1,
            beyond,
          ),
        );
        break;
      }
    }
  }
  const shapes = new Set(blocks.map((b) => `${b.rows}x${b.columns}`));
  if (issues.length === 0 && shapes.size > 1) {
    const list = blocks.map((b) => `"${shorten(b.title)}" ${b.rows} × ${b.columns}`).join(', ');
    issues.push(
      problem(sheet, `the plate grids differ in size (${list}); every grid of a plate has its shape.`),
    );
  }
  const pairs = keyValuePairs(sheet, headerRow - 1);
  const constantCells = constants.map((key) => {
    const pair = pairs.find((p) => normaliseLabel(p.key) === normaliseLabel(key));
    if (!pair) {
      issues.push(
        problem(
          sheet,
          `the key "${shorten(key)}", read as a column of every well, is not among the lines above row ${headerRow}.`,
        ),
      );
      return null;
    }
    const cells = sheet.rows[pair.row - 1] ?? [];
    const keyColumn = cells.findIndex((cell) => !isBlankCell(cell));
    const valueColumn = cells.findIndex((cell, c) => c > keyColumn && !isBlankCell(cell));
    return {
      key: pair.key,
      value: pair.value,
      source: {
        row: pair.row,
        column: valueColumn < 0 ? keyColumn : valueColumn,
        header: pair.key,
        well: null,
      },
    };
  });
  if (issues.length > 0) return { ok: false, issues };

  const first = blocks[0]!;
  const header: Cell[] = [
    GRID_WELL_HEADER,
    ...constantCells.map((c) => c!.key),
    ...blocks.map((b) => b.title),
  ];
  const rows: Cell[][] = [header];
  const sources: (CellSource | null)[][] = [
    [
      null,
      ...constantCells.map((c) => c!.source),
      ...blocks.map((b) => ({ row: b.titleRow + 1, column: b.titleColumn, header: b.title, well: null })),
    ],
  ];
  const homes: ReshapedTable['homes'] = [{ row: first.titleRow + 1, well: null }];
  for (let r = 0; r < first.rows; r += 1) {
    for (let c = 0; c < first.columns; c += 1) {
      const values = blocks.map((b) => sheet.rows[b.top + r]?.[b.left + c] ?? null);
      if (values.every(isBlankCell)) continue;
      const well = wellLabel(r, c);
      rows.push([well, ...constantCells.map((cell) => cell!.value), ...values]);
      sources.push([
        { row: first.top + r + 1, column: first.left + c, header: first.title, well },
        ...constantCells.map((cell) => cell!.source),
        ...blocks.map((b) => ({ row: b.top + r + 1, column: b.left + c, header: b.title, well })),
      ]);
      homes.push({ row: first.top + r + 1, well });
    }
  }
  return { ok: true, table: { kind: 'grid', sheet: { ...sheet, rows }, sources, homes } };
}

// ----------------------------------------------------------------------------------------- placing

/**
 * An issue of the table moved to the file's own cells: its row and column become the source cell's
 * (a grid cell's message also names its grid and well), and rows the message names become the file's.
 */
export function placeIssue(issue: ImportIssue, table: ReshapedTable): ImportIssue {
  const prefix = `${describeLocation(issue.sheet, issue.row, issue.column)}: `;
  if (!issue.message.startsWith(prefix)) return issue;
  let detail = placeRowsInText(issue.message.slice(prefix.length), table);
  if (table.kind === 'grid')
    detail = detail
      .replace('the header row has no column', 'no grid is titled')
      .replace('; its headers are', '; the grids and columns read are');
  const tableRow = issue.row === null ? null : issue.row - 1;
  const tableColumn = issue.column ? columnIndex(issue.column.letter) : null;
  const source =
    tableRow === null || tableColumn === null ? null : (table.sources[tableRow]?.[tableColumn] ?? null);
  const home = tableRow === null ? null : (table.homes[tableRow] ?? null);
  let where: string;
  let row: number | null;
  let column: ImportIssue['column'];
  if (source) {
    row = source.row;
    column = { letter: columnLetter(source.column), header: source.header };
    where =
      source.well !== null
        ? `Sheet "${issue.sheet}", row ${row}, column ${column.letter} (grid "${shorten(source.header ?? '')}", well ${source.well})`
        : describeLocation(issue.sheet, row, column);
  } else if (home) {
    row = home.well === null ? home.row : null;
    column = null;
    where =
      home.well === null
        ? describeLocation(issue.sheet, home.row, null)
        : `Sheet "${issue.sheet}", well ${home.well}`;
  } else {
    row = null;
    column = null;
    where = describeLocation(issue.sheet, null, null);
  }
  return { ...issue, row, column, message: `${where}: ${detail}` };
}

/** "row 12" of the table, in a message, as the file's row (or, for a grid, the well). */
function placeRowsInText(text: string, table: ReshapedTable): string {
  return text.replace(/\brow (\d+)\b/g, (whole, n: string) => {
    const home = table.homes[Number(n) - 1];
    if (!home) return whole;
    return home.well === null ? `row ${home.row}` : `well ${home.well}`;
  });
}

/** The file's row a row of the table stands for (for a grid, its well's row in the first grid). */
export function fileRowOf(tableRow: number, table: ReshapedTable): number {
  return table.homes[tableRow - 1]?.row ?? tableRow;
}

/**
 * The cells whose normalised texts fingerprint a layout (lib/imports/fingerprint.ts): the header row for
 * long and wide sheets; for grids, "grid" and the titles of the grids from the header row down.
 */
export function layoutHeaderCells(sheet: SheetData, layout: SheetLayout, headerRow: number): Cell[] {
  if (layout.kind !== 'grid') return sheet.rows[headerRow - 1] ?? [];
  const { blocks } = findGridBlocks(sheet, headerRow - 1);
  return blocks.length === 0 ? [] : ['grid', ...blocks.map((b) => b.title)];
}

function columnIndex(letter: string): number {
  return [...letter].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0) - 1;
}
