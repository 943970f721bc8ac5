import 'server-only';
import type { Transaction } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { guessMapping, type MappingGuess } from '@/lib/imports/guess-mapping';
import { columnMappingSchema, type ColumnMappingInput } from '@/lib/imports/mapping-schema';
import { parseSpreadsheet } from '@/lib/imports/parse-spreadsheet';
import type { PlateFormat } from '@/lib/domain/plate-formats';
import type { Cell, SheetData } from '@/lib/imports/spreadsheet-types';
import { validatePlateSheet, type PlatePreview } from '@/lib/imports/validate-plate-sheet';
import { analysePlate } from '@/lib/science/plate-analysis';
import { queueImportNotices } from '@/lib/signoff/import-notice';
import { Compound, ImportTemplate, Screen, Target } from '@/models';
import { parsedPlateInput } from './analysis-input';
import { analysisSettings } from './settings';
import { findDuplicateUpload, sha256Hex, storePlate } from './store';

/**
 * Import in three requests, inspect → preview → commit (the browser sends the file with each). Within
 * one request the file is read and parsed once (`readOnce`, in a worker thread with limits); every
 * later step (duplicate check, sheet choice, validation, QC, storing) takes the parsed sheets.
 */

export interface Upload {
  screenId: string;
  bytes: Uint8Array;
  filename: string;
  mediaType: string;
  /** The file once read (readOnce): later steps take its sheets and never read the bytes again. */
  parsed?: ParsedFile;
}

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
}

/** The upload read and parsed, once per request: the parse worker's result, or the one it was given before. */
export async function readOnce<T extends Upload>(upload: T): Promise<T & { parsed: ParsedFile }> {
  if (upload.parsed) return { ...upload, parsed: upload.parsed };
  const sha256 = sha256Hex(upload.bytes);
  const result = await parseSpreadsheet(upload.bytes, upload.filename);
  if (!result.ok) throw new AppError(result.error.code === 'too_large' ? 'too_large' : 'invalid', result.error.message, { code: result.error.code });
  if (result.sheets.length === 0) throw new AppError('invalid', `${upload.filename} holds no sheets.`);
  return { ...upload, parsed: { sha256, sheets: result.sheets } };
}

async function loadScreen(screenId: string) {
  db();
  const screen = await Screen.findByPk(screenId, { include: [{ model: Target, as: 'targets' }] });
  if (!screen) throw new AppError('not_found', 'No such screen.');
  const targets = (screen.get('targets') as Target[]).map((t) => t.name);
  if (targets.length === 0) throw new AppError('invalid', `Screen ${screen.name} has no targets yet; an administrator adds them first.`);
  return { screen, targets };
}

/** Step 1: reads the file, refuses a duplicate, and proposes a mapping for every sheet. Nothing is written. */
export async function inspectUpload(actor: Actor, upload: Upload) {
  requireCapability(actor, 'importPlates');
  await loadScreen(upload.screenId);
  const { parsed } = await readOnce(upload);
  const duplicateOf = await findDuplicateUpload(upload.screenId, parsed.sha256);
  const inspected: SheetInspection[] = parsed.sheets.map((sheet) => {
    const guess = guessMapping(sheet);
    const headerRow = guess.mapping.headerRow;
    return {
      name: sheet.name,
      rowCount: sheet.rows.length,
      headerRow,
      headers: (sheet.rows[headerRow - 1] ?? []).map((cell) => (cell === null ? '' : String(cell))),
      sample: sheet.rows.slice(headerRow, headerRow + 5),
      guess,
    };
  });
  return { sha256: parsed.sha256, duplicateOf, sheets: inspected };
}

export interface PreviewRequest extends Upload {
  sheet: string;
  mapping: ColumnMappingInput;
  format?: PlateFormat;
}

/** Step 2: every row with its parse result and QC flags, the plate built from good rows. Nothing is written. */
export async function previewImport(actor: Actor, request: PreviewRequest, options: { qc?: boolean } = {}): Promise<PlatePreview & { qc: Record<number, string[]> }> {
  requireCapability(actor, 'importPlates');
  const { screen, targets } = await loadScreen(request.screenId);
  const { parsed } = await readOnce(request);
  const sheet = parsed.sheets.find((s) => s.name === request.sheet);
  if (!sheet) throw new AppError('invalid', `${request.filename} has no sheet named "${request.sheet}".`);
  const compounds = await Compound.findAll({ attributes: ['identifier'], raw: true });
  const preview = validatePlateSheet(sheet, request.mapping, {
    knownCompounds: compounds.map((c) => c.identifier), knownTargets: targets, ...(request.format ? { plateFormat: request.format } : {}),
  });
  // The commit skips the QC messages per row (qc: false): it stores the same analysis itself.
  return { ...preview, qc: preview.plate && options.qc !== false ? qcByRow(preview, analysisSettings(screen)) : {} };
}

/** QC messages per spreadsheet row, from the same analysis the commit stores. */
function qcByRow(preview: PlatePreview, settings: ReturnType<typeof analysisSettings>): Record<number, string[]> {
  // Readouts are named by their spreadsheet row (parsedPlateInput), so the messages map back to rows.
  const { wells, readouts } = parsedPlateInput(preview.plate!);
  const analysis = analysePlate(wells, readouts, settings);
  return Object.fromEntries(analysis.readouts.filter((r) => r.qcReasons.length).map((r) => [Number(r.id), r.qcReasons.map((q) => q.message)]));
}

export interface CommitRequest extends PreviewRequest {
  label: string;
  templateName?: string | undefined;
  supersedesPlateId?: string | undefined;
}

/**
 * Step 3: stores the plate, its wells, readouts and QC, its queued fit job, and the template, all in one
 * transaction (the caller's when given: a queued import also removes its upload in it, lib/plates/import-jobs.ts).
 */
export async function commitImport(actor: Actor, request: CommitRequest, options: { transaction?: Transaction } = {}): Promise<{ plateId: string }> {
  // The preview reads the file (once) and checks role and screen; the commit only stores what it built.
  const preview = await previewImport(actor, request, { qc: false });
  if (!preview.ok || !preview.plate) {
    const first = preview.issues.find((issue) => issue.severity === 'error');
    throw new AppError('invalid', first ? `The sheet has ${preview.summary.errors} error(s); first: ${first.message}` : 'The sheet holds no wells.', { issues: preview.issues.slice(0, 200) });
  }
  const mapping = columnMappingSchema.parse(request.mapping);
  const store = async (transaction: Transaction) => {
    let importTemplateId: string | null = null;
    if (request.templateName) {
      const [template, created] = await ImportTemplate.findOrCreate({
        where: { name: request.templateName }, defaults: { name: request.templateName, mapping, createdBy: actor.id }, transaction,
      });
      if (created) {
        await recordAudit({ actorId: actor.id, action: 'create', entityType: 'import_template', entityId: template.id, after: { name: template.name, mapping }, address: actor.address }, transaction);
      } else if (JSON.stringify(template.mapping) !== JSON.stringify(mapping)) {
        const before = template.mapping;
        await template.update({ mapping }, { transaction });
        await recordAudit({ actorId: actor.id, action: 'update', entityType: 'import_template', entityId: template.id, before, after: mapping, address: actor.address }, transaction);
      }
      importTemplateId = template.id;
    }
    const stored = await storePlate(actor, {
      screenId: request.screenId, label: request.label, plate: preview.plate!, importTemplateId,
      file: { bytes: request.bytes, filename: request.filename, mediaType: request.mediaType },
      supersedesPlateId: request.supersedesPlateId ?? null,
    }, transaction);
    await queueImportNotices(actor, stored.plateId, transaction); // chemists hear of the new plate (lib/signoff)
    return stored;
  };
  return options.transaction ? store(options.transaction) : db().transaction(store);
}
