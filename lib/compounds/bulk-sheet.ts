import { findHeaderRow } from '@/lib/imports/guess-mapping';
import { columnLetter, normaliseLabel } from '@/lib/imports/normalise-text';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import { bulkCompoundRowSchema, type BulkCompoundRow } from '@/lib/validation/compounds';

/** Registry fields and the header words (normalised) that name them in a registration sheet. */
const HEADERS: Record<keyof BulkCompoundRow, string[]> = {
  identifier: ['identifier', 'id', 'compoundid', 'compound', 'compoundidentifier'],
  name: ['name', 'compoundname'],
  smiles: ['smiles', 'structure'],
  molecularWeight: ['molecularweight', 'mw', 'molweight', 'mwgmol'],
  lot: ['lot', 'batch', 'batchlot', 'lotnumber', 'batchid'],
  purity_percent: ['purity', 'puritypercent', 'puritypct'],
  stockConcentration_mM: [
    'stock',
    'stockmm',
    'stockconcentration',
    'stockconcentrationmm',
    'stockconc',
    'stockconcmm',
  ],
  solvent: ['solvent'],
};

export interface BulkRowResult {
  row: number;
  input: BulkCompoundRow | null;
  errors: string[];
}

/** Reads a registration sheet: the header row, each row checked with the registry's own schema. */
export function readRegistrationSheet(sheet: SheetData): { rows: BulkRowResult[]; problems: string[] } {
  const headerRow = findHeaderRow(sheet.rows);
  const headers = (sheet.rows[headerRow - 1] ?? []).map((cell) => normaliseLabel(String(cell ?? '')));
  const columns = Object.fromEntries(
    Object.entries(HEADERS).map(([field, words]) => [field, headers.findIndex((h) => words.includes(h))]),
  ) as Record<keyof BulkCompoundRow, number>;
  if (columns.identifier < 0) {
    return {
      rows: [],
      problems: [
        `Sheet "${sheet.name}", row ${headerRow}: no column names the compound identifier (a header such as "Identifier").`,
      ],
    };
  }
  const rows: BulkRowResult[] = [];
  const seen = new Map<string, number>();
  sheet.rows.slice(headerRow).forEach((cells, index) => {
    const row = headerRow + index + 1;
    if (cells.every((c) => c === null || String(c).trim() === '')) return;
    const raw = Object.fromEntries(
      Object.entries(columns)
        .filter(([, i]) => i >= 0)
        .map(([field, i]) => [field, cells[i] === null || cells[i] === undefined ? '' : String(cells[i])]),
    );
    const parsed = bulkCompoundRowSchema.safeParse(raw);
    const where = (field: string) => {
      const i = columns[field as keyof BulkCompoundRow];
      return `Sheet "${sheet.name}", row ${row}${i >= 0 ? `, column ${columnLetter(i)}` : ''}`;
    };
    if (!parsed.success) {
      rows.push({
        row,
        input: null,
        errors: parsed.error.issues.map((issue) => `${where(String(issue.path[0]))}: ${issue.message}`),
      });
      return;
    }
    const key = parsed.data.identifier.toUpperCase();
    const first = seen.get(key);
    if (first !== undefined) {
      rows.push({
        row,
        input: null,
        errors: [
          `${where('identifier')}: ${parsed.data.identifier} is already on row ${first} of this sheet.`,
        ],
      });
      return;
    }
    seen.set(key, row);
    rows.push({ row, input: parsed.data, errors: [] });
  });
  return {
    rows,
    problems: rows.length
      ? []
      : [`Sheet "${sheet.name}" has no compound rows below its header (row ${headerRow}).`],
  };
}
