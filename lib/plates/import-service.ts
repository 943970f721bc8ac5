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
import { validatePlateSheet, type FileProblem, type PlatePreview } from '@/lib/imports/validate-plate-sheet';
import type { ImportIssue } from '@/lib/imports/import-issue';
import { guessPlateSplit, splitPlates, type PlatePart } from '@/lib/imports/split-plates';
import { layoutHeaderCells } from '@/lib/imports/reshape-table';
import { analysePlate } from '@/lib/science/plate-analysis';
import type { QcRuleNotApplied } from '@/lib/science/qc/qc-rules';
import { queueImportNotices } from '@/lib/signoff/import-notice';
import { Screen, Target } from '@/models';
import { parsedPlateInput } from './analysis-input';
import { consumeDraft, createDraft, readDraft } from './import-drafts';
import { analysisSettings } from './settings';
import { plateLabel } from './import-facts';
import { findDuplicateUpload, sha256Hex, storePlate, storeUploadedFile } from './store';
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

/**
 * One plate of the file as the check step lists it: its key in the file (sheet name or plate-column value),
 * the label the file gives it, its well count, and its own problems and issues, each naming the plate.
 */
export interface PlateCheck {
  key: string;
  sheet: string;
  label: string;
  labelSource: 'barcode' | 'sheet' | 'column' | 'file';
  wellCount: number;
  /** The plate's format (96, 384, 1536), null when no well could be read. */
  format: PlateFormat | null;
  /** Its wells by role, and the rows the role value map marks empty (skipped). */
  roleCounts: { negativeControl: number; positiveControl: number; test: number; empty: number };
  ok: boolean;
  summary: PlatePreview['summary'];
  fileProblems: FileProblem[];
  /** At most 200 of its issues, errors first. */
  issues: ImportIssue[];
  facts: PlateFacts;
  factWarnings: string[];
  /** Wells QC flags on at least one readout. */
  qcFlaggedWells: number;
  /** The QC rules this plate's readouts leave unapplied (the others still run). */
  qcRulesNotApplied: QcRuleNotApplied[];
}

/**
 * What the check step shows: the first plate's preview (rows, QC messages per row, the QC rules not
 * applied) with the whole file's verdict (`ok`, `fileProblems` and unknown compounds and targets of every
 * plate), and each plate of the file in `plates` (one for a file of one plate).
 */
export type ImportPreview = PlatePreview &
  SheetFacts & {
    qc: Record<number, string[]>;
    /** Rules whose readout the file does not carry (in no well): not applied, the others still run. */
    qcRulesNotApplied: QcRuleNotApplied[];
    plates: PlateCheck[];
  };

/**
 * Step 2: every row with its parse result and QC flags, the plate built from good rows, whole-file
 * problems with what to do, and the QC rules the file's readouts leave unapplied; for a file of several
 * plates the first plate's rows and every plate's check. Nothing is written.
 */
export async function previewImport(actor: Actor, request: PreviewRequest): Promise<ImportPreview> {
  return (await checkImport(actor, request)).preview;
}

/** A plate of the file as a check found it: the part, its label, its preview and the QC rules it leaves unapplied. */
export interface CheckedPlate {
  part: PlatePart;
  label: Pick<PlateCheck, 'label' | 'labelSource'>;
  preview: PlatePreview & SheetFacts;
  qcRulesNotApplied: QcRuleNotApplied[];
}

/**
 * The check step's preview and each plate of the file as checked (empty when the file cannot be split
 * into its plates: the preview's fileProblems say why), for callers that report per plate
 * (lib/plates/import-once.ts). Nothing is written.
 */
export async function checkImport(
  actor: Actor,
  request: PreviewRequest,
): Promise<{ preview: ImportPreview; plates: CheckedPlate[] }> {
  requireCapability(actor, 'importPlates');
  const { file, screen, targets } = await openSource(actor, request);
  const checked = await checkFile(file, targets, request);
  const settings = analysisSettings(screen);
  const plates = checked.ok
    ? checked.parts.map((part) => ({
        ...part,
        label: partLabel(part, file.filename),
        qcRulesNotApplied: part.preview.plate ? previewQc(part.preview, settings).qcRulesNotApplied : [],
      }))
    : [];
  return { preview: filePreview(checked, file.filename, settings), plates };
}

/** The plate facts read from outside the table, and a warning for each located fact not found. */
interface SheetFacts {
  facts: PlateFacts;
  factWarnings: string[];
}

/** A plate of the file checked: the part and its preview. */
interface CheckedPart {
  part: PlatePart;
  preview: PlatePreview & SheetFacts;
}

/** The file checked plate by plate, or the reasons it cannot be split into plates. */
type CheckedFile = { ok: true; parts: CheckedPart[] } | { ok: false; sheet: string; problems: FileProblem[] };

/**
 * Splits the file into its plates as the mapping says (lib/imports/split-plates.ts) and validates each
 * against the registered compounds and the screen's targets, as one plate's file would be.
 */
async function checkFile(
  file: OpenedFile,
  targets: string[],
  choice: SheetChoice,
  transaction?: Transaction,
): Promise<CheckedFile> {
  if (!file.sheets.some((s) => s.name === choice.sheet))
    throw new AppError('invalid', `${file.filename} has no sheet named "${choice.sheet}".`);
  const mapping = columnMappingDraftSchema.parse(choice.mapping);
  const split = splitPlates(file.sheets, choice.sheet, mapping);
  if (!split.ok)
    return {
      ok: false,
      sheet: choice.sheet,
      problems: split.problems.map((p) => ({ code: 'plate_split' as const, ...p })),
    };
  const options = {
    knownCompounds: await knownCompoundNames(transaction), // identifiers and aliases (lib/compounds/aliases.ts)
    knownTargets: targets,
    targetAliases: await screenTargetAliases(file.screenId, transaction),
    ...(choice.format ? { plateFormat: choice.format } : {}),
  };
  const parts = split.parts.map((part) => {
    const preview = validatePlateSheet(part.sheet, part.mapping, options);
    const { facts, warnings } = readPlateFacts(file.sheets, part.mapping);
    return { part, preview: { ...preview, facts, factWarnings: warnings } };
  });
  return { ok: true, parts };
}

/** The label a plate gets unless the person gives one: the file's (barcode, sheet, column value), else the file name. */
function partLabel(checked: CheckedPart, filename: string): Pick<PlateCheck, 'label' | 'labelSource'> {
  const { part, preview } = checked;
  if (part.label !== null && part.labelSource !== null)
    return { label: part.label, labelSource: part.labelSource };
  const found = plateLabel(undefined, preview.facts, filename);
  return { label: found.plateLabel, labelSource: found.labelSource === 'barcode' ? 'barcode' : 'file' };
}

/** A message prefixed with the plate it belongs to, in a file of several plates. */
const ofPlate = (several: boolean, label: string, message: string) =>
  several ? `Plate "${label}": ${message}` : message;

/** The check step's preview of the whole file (see ImportPreview). */
function filePreview(
  checked: CheckedFile,
  filename: string,
  settings: ReturnType<typeof analysisSettings>,
): ImportPreview {
  if (!checked.ok) {
    const empty = validatePlateSheet(
      { name: checked.sheet, rows: [], decimalComma: false },
      {},
      { knownCompounds: [], knownTargets: [] },
    );
    return {
      ...empty,
      issues: [],
      summary: { rows: 0, okRows: 0, errorRows: 0, errors: checked.problems.length, warnings: 0 },
      fileProblems: checked.problems,
      ok: false,
      facts: {},
      factWarnings: [],
      qc: {},
      qcRulesNotApplied: [],
      plates: [],
    };
  }
  const several = checked.parts.length > 1;
  const plates: PlateCheck[] = checked.parts.map((checkedPart) => {
    const { part, preview } = checkedPart;
    const { label, labelSource } = partLabel(checkedPart, filename);
    const { qc, qcRulesNotApplied } = preview.plate
      ? previewQc(preview, settings)
      : { qc: {}, qcRulesNotApplied: [] };
    const wells = preview.plate?.wells ?? [];
    const count = (role: string) => wells.filter((w) => w.role === role).length;
    const flaggedRows = new Set(Object.keys(qc).map(Number));
    const flagged = (preview.plate?.wells ?? []).filter((w) =>
      w.readouts.some((r) => flaggedRows.has(r.row)),
    );
    const issues = [...preview.issues]
      .sort((a, b) => Number(b.severity === 'error') - Number(a.severity === 'error'))
      .slice(0, 200)
      .map((issue) => ({ ...issue, message: ofPlate(several, label, issue.message) }));
    return {
      key: part.key,
      sheet: part.sheet.name,
      label,
      labelSource,
      wellCount: wells.length,
      format: preview.plate?.format ?? null,
      roleCounts: {
        negativeControl: count('vehicle'),
        positiveControl: count('reference'),
        test: count('test'),
        empty: preview.emptyWells,
      },
      ok: preview.ok,
      summary: preview.summary,
      fileProblems: preview.fileProblems.map((p) => ({ ...p, message: ofPlate(several, label, p.message) })),
      issues,
      facts: preview.facts,
      factWarnings: preview.factWarnings.map((w) => ofPlate(several, label, w)),
      qcFlaggedWells: flagged.length,
      qcRulesNotApplied,
    };
  });
  const first = checked.parts[0]!.preview;
  const firstQc: Pick<ImportPreview, 'qc' | 'qcRulesNotApplied'> = first.plate
    ? previewQc(first, settings)
    : { qc: {}, qcRulesNotApplied: [] };
  if (!several) return { ...first, ...firstQc, plates };
  // The whole file's verdict: every plate's problems and unknown names, each naming its plate.
  const previews = checked.parts.map((p) => p.preview);
  return {
    ...first,
    ...firstQc,
    qcRulesNotApplied: rulesOfPlates(plates),
    ok: plates.every((p) => p.ok),
    fileProblems: plates.flatMap((p) => p.fileProblems),
    summary: {
      rows: sum(previews, (p) => p.summary.rows),
      okRows: sum(previews, (p) => p.summary.okRows),
      errorRows: sum(previews, (p) => p.summary.errorRows),
      errors: sum(previews, (p) => p.summary.errors),
      warnings: sum(previews, (p) => p.summary.warnings),
    },
    unknownCompounds: mergeRows(
      previews.flatMap((p) => p.unknownCompounds),
      (c) => c.identifier,
    ),
    unknownTargets: mergeRows(
      previews.flatMap((p) => p.unknownTargets),
      (t) => t.name,
    ),
    factWarnings: plates.flatMap((p) => p.factWarnings),
    plates,
  };
}

/**
 * The QC rules not applied on any plate of a file: a rule no plate applies is told as it is; a rule only
 * some plates leave unapplied names those plates.
 */
function rulesOfPlates(plates: readonly PlateCheck[]): QcRuleNotApplied[] {
  const byRule = new Map<string, { rule: QcRuleNotApplied; labels: string[] }>();
  for (const plate of plates)
    for (const rule of plate.qcRulesNotApplied) {
      const seen = byRule.get(rule.rule) ?? { rule, labels: [] };
      seen.labels.push(plate.label);
      byRule.set(rule.rule, seen);
    }
  return [...byRule.values()].map(({ rule, labels }) =>
    labels.length === plates.length
      ? rule
      : {
          ...rule,
          message: `${labels.length === 1 ? 'Plate' : 'Plates'} ${labels.map((l) => `"${l}"`).join(', ')}: ${rule.message}`,
        },
  );
}

const sum = <T>(items: readonly T[], value: (item: T) => number) =>
  items.reduce((total, item) => total + value(item), 0);

/** Items of several plates merged by name, their rows joined. */
function mergeRows<T extends { rows: number[] }>(items: readonly T[], key: (item: T) => string): T[] {
  const byKey = new Map<string, T>();
  for (const item of items) {
    const seen = byKey.get(key(item));
    byKey.set(key(item), seen ? { ...seen, rows: [...new Set([...seen.rows, ...item.rows])] } : item);
  }
  return [...byKey.values()];
}

/** QC messages per spreadsheet row and the rules not applied, from the same analysis the commit stores. */
function previewQc(
  preview: PlatePreview,
  settings: ReturnType<typeof analysisSettings>,
): Pick<ImportPreview, 'qc' | 'qcRulesNotApplied'> {
  // Readouts are named by their spreadsheet row (parsedPlateInput), so the messages map back to rows.
  const { wells, readouts } = parsedPlateInput(preview.plate!);
  const analysis = analysePlate(wells, readouts, settings);
  const qc: Record<number, string[]> = {};
  for (const r of analysis.readouts) {
    if (r.qcReasons.length === 0) continue;
    const row = Number.parseInt(r.id, 10);
    const useDependent = r.id.endsWith(':use_dependent');
    const messages = r.qcReasons.map((q) =>
      useDependent ? `Use-dependent readout: ${q.message}` : q.message,
    );
    qc[row] = [...(qc[row] ?? []), ...messages];
  }
  return { qc, qcRulesNotApplied: analysis.qcRulesNotApplied };
}

export type CommitRequest = PreviewRequest & {
  /** The plate's label; for a file of several plates, the label of any plate `labels` does not name. */
  label: string;
  /** Labels of a file's plates by their key (sheet name or plate-column value); each plate's own by default. */
  labels?: Record<string, string> | undefined;
  templateName?: string | undefined;
  supersedesPlateId?: string | undefined;
};

/** A plate stored by a commit: its id and label. */
export interface StoredPlate {
  plateId: string;
  label: string;
}

/** The refusal of a file a check found faults in: the first plate with a fault is named, nothing is stored. */
function commitRefusal(checked: CheckedFile, labels: readonly string[]): AppError {
  if (!checked.ok) {
    const problem = checked.problems[0]!;
    return new AppError(
      'invalid',
      `The file cannot be split into plates; nothing was stored: ${problem.message} ${problem.whatToDo}`,
      { fileProblems: checked.problems, issues: [] },
    );
  }
  const several = checked.parts.length > 1;
  const index = checked.parts.findIndex((p) => !p.preview.ok || !p.preview.plate);
  const { preview } = checked.parts[index]!;
  const label = labels[index]!;
  // A whole-file problem comes first, with what to do; otherwise the first row error.
  const problem = preview.fileProblems[0];
  const first = preview.issues.find((issue) => issue.severity === 'error');
  const firstText = problem ? `${problem.message} ${problem.whatToDo}` : first?.message;
  const what = firstText
    ? `${several ? `Plate "${label}"` : 'The sheet'} has ${preview.summary.errors} error(s); first: ${firstText}`
    : `${several ? `Plate "${label}"` : 'The sheet'} holds no wells.`;
  return new AppError('invalid', several ? `${what} No plate of the file was stored.` : what, {
    fileProblems: preview.fileProblems.map((p) => ({ ...p, message: ofPlate(several, label, p.message) })),
    issues: preview.issues
      .slice(0, 200)
      .map((issue) => ({ ...issue, message: ofPlate(several, label, issue.message) })),
    ...(several ? { plate: label } : {}),
  });
}

/** Each plate's label: the one given for its key, else (one plate) the request's, else the file's own. */
function commitLabels(checked: Extract<CheckedFile, { ok: true }>, request: CommitRequest, filename: string) {
  const several = checked.parts.length > 1;
  const labels = checked.parts.map((part) => {
    const given = request.labels?.[part.part.key]?.trim();
    if (given) return given.slice(0, 120);
    if (!several) return request.label;
    return partLabel(part, filename).label;
  });
  const repeated = labels.find((label, i) => labels.indexOf(label) !== i);
  if (repeated !== undefined)
    throw new AppError(
      'invalid',
      `Two plates of this file would both be labelled "${repeated}"; give each plate its own label. Nothing was stored.`,
    );
  return labels;
}

/**
 * Step 3: stores every plate of the file (one, or each sheet or plate-column value as the mapping says),
 * each with its wells, readouts and QC, its queued fit job and its audit event, the file once, the template,
 * and consumes the draft it came from, all in one transaction (the caller's when given: a queued import also
 * removes its upload in it, lib/plates/import-jobs.ts): a fault in any plate stores none. A draft is read
 * under its row lock in that transaction, so a second commit of it waits and is then refused as used.
 */
export async function commitImport(
  actor: Actor,
  request: CommitRequest,
  options: {
    transaction?: Transaction;
    /** Told when the import moves on to checking the rows and to storing the plate (the job's progress). */
    onStage?: (stage: 'checking' | 'storing') => Promise<void>;
  } = {},
): Promise<{ plateId: string; plates: StoredPlate[] }> {
  requireCapability(actor, 'importPlates');
  // A file sent with the request is read before the transaction opens (the screen checked first).
  const source: ImportSource =
    'draftId' in request ? request : await loadScreen(request.screenId).then(() => readOnce(request));
  const store = async (transaction: Transaction) => {
    const { file, targets } = await openSource(actor, source, transaction);
    await options.onStage?.('checking');
    const checked = await checkFile(file, targets, request, transaction);
    if (!checked.ok) throw commitRefusal(checked, []);
    const labels = commitLabels(checked, request, file.filename);
    if (checked.parts.some((p) => !p.preview.ok || !p.preview.plate)) throw commitRefusal(checked, labels);
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
    const fileRecord = { bytes: file.bytes, filename: file.filename, mediaType: file.mediaType };
    // The file is stored once (duplicates refused there); its plates share the record.
    const uploadedFile = await storeUploadedFile(actor, file.screenId, fileRecord, transaction);
    const plates: StoredPlate[] = [];
    for (const [index, { preview }] of checked.parts.entries()) {
      const label = labels[index]!;
      const stored = await storePlate(
        actor,
        {
          screenId: file.screenId,
          label,
          facts: preview.facts,
          plate: preview.plate!,
          importTemplateId,
          file: fileRecord,
          uploadedFile,
          supersedesPlateId: checked.parts.length === 1 ? (request.supersedesPlateId ?? null) : null,
        },
        transaction,
      );
      plates.push({ plateId: stored.plateId, label });
    }
    const plateIds = plates.map((p) => p.plateId);
    if (file.draftId) await consumeDraft(file.draftId, plateIds, transaction);
    await queueImportNotices(actor, plateIds, transaction); // chemists hear of the new plates, once (lib/signoff)
    return { plateId: plateIds[0]!, plates };
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
    // Several plates in the file (issue 18): a sheet per plate, or a plate column.
    guess.mapping = { ...guess.mapping, plates: guessPlateSplit(sheets, sheet, guess.mapping) };
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
