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
  /** Every plate of the file (one, or a plate per sheet or plate-column value), as checked. */
  plates: PlateCheckView[];
}

/** One plate of the file on the check step (lib/plates/import-service.ts, PlateCheck). */
export interface PlateCheckView {
  key: string;
  sheet: string;
  label: string;
  labelSource: string;
  wellCount: number;
  format: number | null;
  roleCounts: { negativeControl: number; positiveControl: number; test: number; empty: number };
  ok: boolean;
  summary: { rows: number; okRows: number; errorRows: number; errors: number; warnings: number };
  fileProblems: { code: string; message: string; whatToDo: string }[];
  issues: { message: string; severity: 'error' | 'warning' }[];
  facts: FoundFacts;
  factWarnings: string[];
  qcFlaggedWells: number;
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

/** Where a piece of import work stands, as the wizard shows it (import-progress.tsx). */
export type WorkStage = 'uploading' | 'reading' | 'checking' | 'queued' | 'taking' | 'storing' | 'fitting';
export interface WorkProgress {
  /** The work under way: reading the file (inspect), checking every row (preview) or storing the plate. */
  work: 'inspect' | 'preview' | 'commit';
  stage: WorkStage;
  /** Percent of the file sent, while uploading (the browser counts the bytes). */
  percent?: number;
}

/** The error of an answer that is not 2xx, with the server's message and the fields it named. */
function answerError(status: number, json: { message?: string; details?: unknown; fields?: unknown }) {
  const fields = json.fields as Record<string, string[]> | undefined;
  const fieldText = fields ? Object.values(fields).flat().join(' ') : '';
  const message = [json.message ?? `The server answered ${status}.`, fieldText].filter(Boolean).join(' ');
  return new ImportRequestError(message, json.details);
}

/**
 * Sends the file to inspect with the upload's progress: `onProgress` hears the percent sent (the browser
 * counts the bytes), then that the server is reading the file once every byte is sent.
 */
export function inspectWithProgress<T>(
  fields: Record<string, string>,
  file: File,
  onProgress: (progress: WorkProgress) => void,
): Promise<T> {
  const body = new FormData();
  body.set('file', file);
  for (const [key, value] of Object.entries(fields)) body.set(key, value);
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/imports/inspect');
    xhr.responseType = 'text';
    onProgress({ work: 'inspect', stage: 'uploading', percent: 0 });
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0)
        onProgress({
          work: 'inspect',
          stage: 'uploading',
          percent: Math.min(100, Math.floor((event.loaded / event.total) * 100)),
        });
    };
    xhr.upload.onload = () => onProgress({ work: 'inspect', stage: 'reading' });
    xhr.onerror = () => reject(new Error('The upload failed: the server could not be reached.'));
    xhr.onabort = () => reject(new Error('The upload was stopped.'));
    xhr.onload = () => {
      let json: T & { message?: string; details?: unknown; fields?: unknown };
      try {
        json = JSON.parse(xhr.responseText) as typeof json;
      } catch {
        return reject(new Error(`The server answered ${xhr.status}.`));
      }
      if (xhr.status < 200 || xhr.status >= 300) reject(answerError(xhr.status, json));
      else resolve(json);
    };
    xhr.send(body);
  });
}

/**
 * Posts the commit and follows the import job's stages as the server tells them (one JSON line each:
 * queued for a worker, reading the kept file, checking every row, storing the plate), then returns the
 * answer's JSON or throws its refusal, as postImportStep does.
 */
export async function commitWithProgress<T>(
  fields: Record<string, string>,
  onProgress: (progress: WorkProgress) => void,
): Promise<T> {
  const body = new FormData();
  for (const [key, value] of Object.entries(fields)) body.set(key, value);
  onProgress({ work: 'commit', stage: 'queued' });
  const response = await fetch('/api/imports/commit', {
    method: 'POST',
    body,
    headers: { accept: 'application/x-ndjson, application/json' },
  });
  const streamed = response.headers.get('content-type')?.includes('application/x-ndjson');
  if (!streamed || !response.body) {
    const json = (await response.json().catch(() => ({}))) as T & { message?: string; details?: unknown };
    if (!response.ok) throw answerError(response.status, json);
    return json;
  }
  const STAGE: Record<string, WorkStage> = {
    queued: 'queued',
    reading: 'taking',
    checking: 'checking',
    storing: 'storing',
  };
  const reader = response.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffered = '';
  type Answer = { status: number; body: T & { message?: string; details?: unknown } };
  let answer: Answer | null = null;
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buffered += value;
    const lines = buffered.split('\n');
    buffered = done ? '' : lines.pop()!;
    for (const line of lines.filter((l) => l.trim() !== '')) {
      const message = JSON.parse(line) as { stage?: string; status?: number; body?: unknown };
      if (message.stage && STAGE[message.stage]) onProgress({ work: 'commit', stage: STAGE[message.stage]! });
      if (typeof message.status === 'number') answer = message as Answer;
    }
    if (done) break;
  }
  if (!answer)
    throw new Error(
      'The connection ended before the server answered; open the plate list to see whether the plate was stored.',
    );
  if (answer.status < 200 || answer.status >= 300) throw answerError(answer.status, answer.body);
  return answer.body;
}
