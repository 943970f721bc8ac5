import 'server-only';
import type { Transaction } from 'sequelize';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { knownCompoundNames } from '@/lib/compounds/aliases';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import {
  guessMapping,
  layoutViews,
  tableView,
  type LayoutView,
  type MappingGuess,
} from '@/lib/imports/guess-mapping';
import {
  columnMappingDraftSchema,
  columnMappingSchema,
  type ColumnMapping,
  type ColumnMappingInput,
} from '@/lib/imports/mapping-schema';
import { guessFactLocators, readPlateFacts, type PlateFacts } from '@/lib/imports/plate-facts';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet, type PlatePreview } from '@/lib/imports/validate-plate-sheet';
import { layoutHeaderCells } from '@/lib/imports/reshape-table';
import { analysePlate } from '@/lib/science/plate-analysis';
import type { QcRuleNotApplied } from '@/lib/science/qc/qc-rules';
import { queueImportNotices } from '@/lib/signoff/import-notice';
import { Screen, Target } from '@/models';
import { parsedPlateInput } from './analysis-input';
import { consumeDraft, createDraft, readDraft } from './import-drafts';
import { analysisSettings } from './settings';
import { findDuplicateUpload, sha256Hex, storePlate } from './store';
import { recogniseTemplate, rememberTargetAliases, saveTemplate, screenTargetAliases } from './templates';

/**
 * Import in three requests, inspect → preview → commit. Inspect reads and parses the file once (`readOnce`,
 * in a worker thread with limits) and keeps it as the person's import draft (lib/plates/import-drafts.ts);
 * preview and commit name the draft and take its sheets, never parsing again. A commit that sends the
 * file itself (scripts, the load test) reads it once, and every later step takes the parsed sheets.
 */

export interface Upload {
  screenId: string;
  bytes: Uint8Array;
  filename: string;
  mediaType: string;
  /** The file once read (readOnce): later steps take its sheets and never read the bytes again. */
  parsed?: ParsedFile;
}

/** An import draft inspect kept, named by its id. */
export interface DraftRef {
  draftId: string;
}

/** Where an import's sheets come from: a draft of the acting person, or a file sent with the request. */
export type ImportSource = DraftRef | Upload;

/** An uploaded file read once: the SHA-256 of its bytes and its sheets. */
export interface ParsedFile {
  sha256: string;
  sheets: SheetData[];
}

export interface SheetInspection {
  name: string;
  rowCount: number;
  headerRow: number;
  headers: string[];
  sample: Cell[][];
  guess: MappingGuess;
  /** Distinct text values of each column below the guessed header row, by 0-based column index (for value maps). */
  values: Record<number, string[]>;
  /** The plate facts found where the guess locates them. */
  facts: PlateFacts;
  /** The layouts the sheet can be read in (long, wide, grid), the guessed one first, for the mapping step. */
  layouts: LayoutView[];
}

/** The upload read and parsed, once per request: the parse worker's result, or the one it was given before. */
export async function readOnce<T extends Upload>(upload: T): Promise<T & { parsed: ParsedFile }> {
  if (upload.parsed) return { ...upload, parsed: upload.parsed };
  const sha256 = sha256Hex(upload.bytes);
  const result = await parseSpreadsheet(upload.bytes, upload.filename);
  if (!result.ok)
    throw new AppError(result.error.code === 'too_large' ? 'too_large' : 'invalid', result.error.message, {
      code: result.error.code,
    });
  if (result.sheets.length === 0) throw new AppError('invalid', `${upload.filename} holds no sheets.`);
  return { ...upload, parsed: { sha256, sheets: result.sheets } };
}

async function loadScreen(screenId: string, transaction?: Transaction) {
  db();
  const screen = await Screen.findByPk(screenId, {
    include: [{ model: Target, as: 'targets' }],
    ...(transaction ? { transaction } : {}),
  });
  if (!screen) throw new AppError('not_found', 'No such screen.');
  const targets = (screen.get('targets') as Target[]).map((t) => t.name);
  if (targets.length === 0)
    throw new AppError(
      'invalid',
      `Screen ${screen.name} has no targets yet; an administrator adds them first.`,
    );
  return { screen, targets };
}

/** The file an import works on: its record and its parsed sheets, and the draft it came from (if any). */
interface OpenedFile {
  screenId: string;
  filename: string;
  mediaType: string;
  bytes: Uint8Array;
  sheets: SheetData[];
  draftId: string | null;
}

/**
 * The source's file and screen: a draft is read (owner only; locked when a transaction is given), an
 * upload is parsed once after its screen is checked.
 */
async function openSource(actor: Actor, source: ImportSource, transaction?: Transaction) {
  if ('draftId' in source) {
    const draft = await readDraft(actor, source.draftId, transaction ? { transaction } : {});
    const file: OpenedFile = { ...draft, draftId: draft.id };
    return { file, ...(await loadScreen(draft.screenId, transaction)) };
  }
  const screen = await loadScreen(source.screenId, transaction);
  const { parsed } = await readOnce(source);
  const file: OpenedFile = {
    screenId: source.screenId,
    filename: source.filename,
    mediaType: source.mediaType,
    bytes: source.bytes,
    sheets: parsed.sheets,
    draftId: null,
  };
  return { file, ...screen };
}

/**
 * Step 1: reads the file (once), refuses a duplicate, proposes a mapping for every sheet, and keeps the
 * parsed file as the actor's import draft for preview and commit. A file already stored for this screen
 * gets no draft (it cannot be stored again); nothing else is written.
 */
export async function inspectUpload(actor: Actor, upload: Upload) {
  requireCapability(actor, 'importPlates');
  await loadScreen(upload.screenId);
  const { parsed } = await readOnce(upload);
  const duplicateOf = await findDuplicateUpload(upload.screenId, parsed.sha256);
  const inspected = inspectSheets(parsed.sheets);
  // A layout mapped before is recognised by its header fingerprint and its template applied (issue 18).
  const recognised = await recogniseTemplate(parsed.sheets);
  const targetAliases = await screenTargetAliases(upload.screenId);
  const draft = duplicateOf
    ? null
    : await createDraft(actor, { ...upload, sha256: parsed.sha256, sheets: parsed.sheets });
  return {
    draftId: draft?.id ?? null,
    expiresAt: draft?.expiresAt.toISOString() ?? null,
    sha256: parsed.sha256,
    duplicateOf,
    sheets: inspected,
    recognised: recognised
      ? {
          templateId: recognised.template.id,
          name: recognised.template.name,
          sheet: recognised.sheet,
          mapping: recognised.template.mapping,
          facts: readPlateFacts(parsed.sheets, recognised.template.mapping).facts,
        }
      : null,
    targetAliases,
  };
}

/** The sheet, mapping and plate format a preview or commit applies. */
export interface SheetChoice {
  sheet: string;
  mapping: ColumnMappingInput;
  format?: PlateFormat;
}

export type PreviewRequest = ImportSource & SheetChoice;

/** What the check step shows: the sheet's preview, QC messages per row, and the QC rules not applied. */
export type ImportPreview = PlatePreview &
  SheetFacts & {
    qc: Record<number, string[]>;
    /** Rules whose readout the file does not carry (in no well): not applied, the others still run. */
    qcRulesNotApplied: QcRuleNotApplied[];
  };

/**
 * Step 2: every row with its parse result and QC flags, the plate built from good rows, whole-file
 * problems with what to do, and the QC rules the file's readouts leave unapplied. Nothing is written.
 */
export async function previewImport(actor: Actor, request: PreviewRequest): Promise<ImportPreview> {
  requireCapability(actor, 'importPlates');
  const { file, screen, targets } = await openSource(actor, request);
  const preview = await checkSheet(file, targets, request);
  if (!preview.plate) return { ...preview, qc: {}, qcRulesNotApplied: [] };
  return { ...preview, ...previewQc(preview, analysisSettings(screen)) };
}

/** The plate facts read from outside the table, and a warning for each located fact not found. */
interface SheetFacts {
  facts: PlateFacts;
  factWarnings: string[];
}

/** Validates the chosen sheet of the file with the mapping against the registered compounds and the screen's targets. */
async function checkSheet(
  file: OpenedFile,
  targets: string[],
  choice: SheetChoice,
  transaction?: Transaction,
): Promise<PlatePreview & SheetFacts> {
  const sheet = file.sheets.find((s) => s.name === choice.sheet);
  if (!sheet) throw new AppError('invalid', `${file.filename} has no sheet named "${choice.sheet}".`);
  const preview = validatePlateSheet(sheet, choice.mapping, {
    knownCompounds: await knownCompoundNames(transaction), // identifiers and aliases (lib/compounds/aliases.ts)
    knownTargets: targets,
    targetAliases: await screenTargetAliases(file.screenId, transaction),
    ...(choice.format ? { plateFormat: choice.format } : {}),
  });
  const { facts, warnings } = readPlateFacts(file.sheets, columnMappingDraftSchema.parse(choice.mapping));
  return { ...preview, facts, factWarnings: warnings };
}

/** QC messages per spreadsheet row and the rules not applied, from the same analysis the commit stores. */
function previewQc(
  preview: PlatePreview,
  settings: ReturnType<typeof analysisSettings>,
): Pick<ImportPreview, 'qc' | 'qcRulesNotApplied'> {
  // Readouts are named by their spreadsheet row (parsedPlateInput), so the messages map back to rows.
  const { wells, readouts } = parsedPlateInput(preview.plate!);
  const analysis = analysePlate(wells, readouts, settings);
  const qc = Object.fromEntries(
    analysis.readouts
      .filter((r) => r.qcReasons.length)
      .map((r) => [Number(r.id), r.qcReasons.map((q) => q.message)]),
  );
  return { qc, qcRulesNotApplied: analysis.qcRulesNotApplied };
}

export type CommitRequest = PreviewRequest & {
  label: string;
  templateName?: string | undefined;
  supersedesPlateId?: string | undefined;
};

/**
 * Step 3: stores the plate, its wells, readouts and QC, its queued fit job, and the template, and
 * consumes the draft it came from, all in one transaction (the caller's when given: a queued import also
 * removes its upload in it, lib/plates/import-jobs.ts). A draft is read under its row lock in that
 * transaction, so a second commit of it waits and is then refused as used.
 */
export async function commitImport(
  actor: Actor,
  request: CommitRequest,
  options: {
    transaction?: Transaction;
    /** Told when the import moves on to checking the rows and to storing the plate (the job's progress). */
    onStage?: (stage: 'checking' | 'storing') => Promise<void>;
  } = {},
): Promise<{ plateId: string }> {
  requireCapability(actor, 'importPlates');
  // A file sent with the request is read before the transaction opens (the screen checked first).
  const source: ImportSource =
    'draftId' in request ? request : await loadScreen(request.screenId).then(() => readOnce(request));
  const store = async (transaction: Transaction) => {
    const { file, targets } = await openSource(actor, source, transaction);
    await options.onStage?.('checking');
    const preview = await checkSheet(file, targets, request, transaction);
    if (!preview.ok || !preview.plate) {
      // A whole-file problem comes first, with what to do; otherwise the first row error.
      const problem = preview.fileProblems[0];
      const first = preview.issues.find((issue) => issue.severity === 'error');
      const firstText = problem ? `${problem.message} ${problem.whatToDo}` : first?.message;
      throw new AppError(
        'invalid',
        firstText
          ? `The sheet has ${preview.summary.errors} error(s); first: ${firstText}`
          : 'The sheet holds no wells.',
        { fileProblems: preview.fileProblems, issues: preview.issues.slice(0, 200) },
      );
    }
    await options.onStage?.('storing');
    const mapping: ColumnMapping = {
      ...columnMappingSchema.parse(request.mapping),
      wellSheet: request.sheet,
    };
    let importTemplateId: string | null = null;
    if (request.templateName) {
      const chosen = file.sheets.find((s) => s.name === request.sheet);
      const headerCells = chosen && layoutHeaderCells(chosen, mapping.layout, mapping.headerRow);
      const template = await saveTemplate(
        actor,
        { name: request.templateName, mapping, headerCells: headerCells ?? null },
        transaction,
      );
      importTemplateId = template.id;
    }
    // The file's target values are remembered as the screen's aliases, so the next file needs no clicks.
    await rememberTargetAliases(actor, file.screenId, mapping.targetValues, transaction);
    const stored = await storePlate(
      actor,
      {
        screenId: file.screenId,
        label: request.label,
        facts: preview.facts,
        plate: preview.plate,
        importTemplateId,
        file: { bytes: file.bytes, filename: file.filename, mediaType: file.mediaType },
        supersedesPlateId: request.supersedesPlateId ?? null,
      },
      transaction,
    );
    if (file.draftId) await consumeDraft(file.draftId, stored.plateId, transaction);
    await queueImportNotices(actor, stored.plateId, transaction); // chemists hear of the new plate (lib/signoff)
    return stored;
  };
  return options.transaction ? store(options.transaction) : db().transaction(store);
}

/** Each sheet's headers, first rows and guessed mapping, as inspect answers them (and a resumed draft). */
export function inspectSheets(sheets: SheetData[]): SheetInspection[] {
  return sheets.map((sheet) => {
    const guess = guessMapping(sheet);
    const headerRow = guess.mapping.headerRow;
    // Plate facts outside the table (issue 18): barcode-like keys on other sheets or above the header.
    const located = guessFactLocators(sheets, sheet.name, headerRow);
    guess.mapping = { ...guess.mapping, facts: located.facts };
    // A wide or grid sheet is mapped as the long table read from it (lib/imports/reshape-table.ts).
    const { headers, sample, values } = tableView(sheet, guess.mapping);
    return {
      name: sheet.name,
      rowCount: sheet.rows.length,
      headerRow,
      headers,
      sample,
      guess,
      values,
      facts: located.found,
      layouts: layoutViews(sheet),
    };
  });
}
