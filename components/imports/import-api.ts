import type { ColumnMapping } from '@/lib/imports/mapping-schema';
import type { ImportIssue } from '@/lib/imports/import-issue';
import type { PreviewRow } from '@/lib/imports/read-row';
import type { Cell } from '@/lib/imports/spreadsheet-types';
import type { GuessedColumn } from '@/lib/imports/guess-mapping';
import type { PlateFact } from '@/lib/imports/import-fields';

/** Plate facts read from outside the file's table, by name. */
export type FoundFacts = Partial<Record<PlateFact, string>>;

export interface Inspection {
  /** The import draft the server keeps the parsed file in; null for a file already stored for the screen. */
  draftId: string | null;
  expiresAt: string | null;
  sha256: string;
  duplicateOf: { plateId: string; label: string } | null;
  sheets: {
    name: string;
    rowCount: number;
    headerRow: number;
    headers: string[];
    sample: Cell[][];
    guess: { mapping: ColumnMapping; matched: GuessedColumn[]; missingFields: string[] };
    /** Distinct text values of each column below the header row, by 0-based column index. */
    values: Record<string, string[]>;
    /** Plate facts found where the guess locates them. */
    facts: FoundFacts;
    /** The layouts the sheet can be read in, the guessed first: each one's mapping and its table's headers. */
    layouts?: { mapping: ColumnMapping; headers: string[]; values: Record<string, string[]> }[];
  }[];
  /** A saved template whose header fingerprint matches one of the file's sheets, applied by the wizard. */
  recognised: {
    templateId: string;
    name: string;
    sheet: string;
    mapping: ColumnMapping;
    facts: FoundFacts;
  } | null;
  /** The screen's remembered target aliases: alias as written → target name. */
  targetAliases: Record<string, string>;
}

export interface Preview {
  sheet: string;
  rows: PreviewRow[];
  issues: ImportIssue[];
  plate: { format: number; formatSource: string; targets: string[]; wells: unknown[] } | null;
  unknownCompounds: { identifier: string; rows: number[] }[];
  unknownTargets: { name: string; rows: number[] }[];
  summary: { rows: number; okRows: number; errorRows: number; errors: number; warnings: number };
  ok: boolean;
  qc: Record<string, string[]>;
  /** Rows the role value map marks empty: skipped and counted. */
  emptyWells: number;
  facts: FoundFacts;
  factWarnings: string[];
  /** Whole-file problems (lib/imports/validate-plate-sheet.ts), each with what to do. */
  fileProblems: { code: string; message: string; whatToDo: string }[];
  /** QC rules whose readout is in no well of the file (lib/science/qc/qc-rules.ts). */
  qcRulesNotApplied: { rule: string; label: string; message: string }[];
}

export class ImportRequestError extends Error {
  constructor(
    message: string,
    readonly details: unknown,
  ) {
    super(message);
  }
}

/**
 * Posts one import step and returns its JSON, or throws with the server's message: inspect sends the
 * file; preview and commit send the draft id inspect answered (in `fields`) and never the file again.
 */
export async function postImportStep<T>(
  step: 'inspect' | 'preview' | 'commit',
  fields: Record<string, string>,
  file?: File,
): Promise<T> {
  const body = new FormData();
  if (file) body.set('file', file);
  for (const [key, value] of Object.entries(fields)) body.set(key, value);
  const response = await fetch(`/api/imports/${step}`, { method: 'POST', body });
  const json = (await response
    .json()
    .catch(() => ({ message: `The server answered ${response.status}.` }))) as T & {
    message?: string;
    details?: unknown;
    fields?: Record<string, string[]>;
  };
  if (!response.ok) {
    const fieldText = json.fields ? Object.values(json.fields).flat().join(' ') : '';
    throw new ImportRequestError([json.message, fieldText].filter(Boolean).join(' '), json.details);
  }
  return json;
}
