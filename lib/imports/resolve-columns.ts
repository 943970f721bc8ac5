import 'server-only';
import { FIELD_LABEL, fieldNeeded, IMPORT_FIELDS, type ImportField } from './import-fields';
import { makeIssue, type ImportIssue } from './import-issue';
import type { ColumnMapping } from './mapping-schema';
import { columnLetter, normaliseLabel } from './normalise-text';
import type { SheetData } from './spreadsheet-types';

/** A mapped field's column in the sheet: 0-based index, letter and header text. */
export interface ResolvedColumn {
  index: number;
  letter: string;
  header: string;
}

export type ResolvedColumns = Partial<Record<ImportField, ResolvedColumn>>;

/** Finds each mapped header in the header row; reports headers that are absent or repeated and required fields left out. */
export function resolveColumns(
  sheet: SheetData,
  mapping: ColumnMapping,
): { columns: ResolvedColumns; issues: ImportIssue[] } {
  const row = mapping.headerRow;
  const headerCells = (sheet.rows[row - 1] ?? []).map((cell) => (cell === null ? '' : String(cell).trim()));
  const columns: ResolvedColumns = {};
  const issues: ImportIssue[] = [];
  for (const field of IMPORT_FIELDS) {
    const wanted = mapping.columns[field];
    if (wanted === null) {
      if (fieldNeeded(field, mapping)) {
        const detail = `no column is chosen for the ${FIELD_LABEL[field]}, which every plate needs.`;
        issues.push(makeIssue({ code: 'missing_column', sheet: sheet.name, row, field, detail }));
      }
      continue;
    }
    const key = normaliseLabel(wanted);
    const found = headerCells.flatMap((header, index) =>
      header !== '' && normaliseLabel(header) === key ? [index] : [],
    );
    const first = found[0];
    if (first === undefined) {
      const detail = `the header row has no column "${wanted}" (chosen for the ${FIELD_LABEL[field]}); its headers are ${listHeaders(headerCells)}.`;
      issues.push(makeIssue({ code: 'missing_column', sheet: sheet.name, row, field, detail }));
      continue;
    }
    if (found.length > 1) {
      const letters = found.map(columnLetter).join(' and ');
      const detail = `the header "${wanted}" (chosen for the ${FIELD_LABEL[field]}) appears in columns ${letters}; rename one so Gatewell knows which to read.`;
      issues.push(makeIssue({ code: 'duplicate_header', sheet: sheet.name, row, field, detail }));
      continue;
    }
    columns[field] = { index: first, letter: columnLetter(first), header: headerCells[first] ?? wanted };
  }
  return { columns, issues };
}

function listHeaders(headers: string[]): string {
  const named = headers.filter((header) => header !== '').map((header) => `"${header}"`);
  if (named.length === 0) return 'all blank';
  return named.length > 12
    ? `${named.slice(0, 12).join(', ')} and ${named.length - 12} more`
    : named.join(', ');
}
