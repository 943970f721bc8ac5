import 'server-only';
import { z } from 'zod';
import { requireCapability, type Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { columnMappingDraftSchema, type ColumnMapping } from '@/lib/imports/mapping-schema';
import type { SheetData } from '@/lib/imports/spreadsheet-types';
import { Screen } from '@/models';
import { createDraft } from './import-drafts';
import {
  guessSheet,
  importFacts,
  joinPlateFacts,
  plateLabel,
  sheetForMapping,
  unreadFileFacts,
  type FileImportFacts,
} from './import-facts';
import { awaitImport, queueImport } from './import-jobs';
import {
  checkImport,
  commitImport,
  readOnce,
  type StoredPlate,
  type ImportPreview,
  type ParsedFile,
  type Upload,
} from './import-service';
import { findDuplicateUpload } from './store';
import { listTemplates, matchTemplate, type TemplateSummary } from './templates';

/**
 * An import in one request, for scripts and automation (`POST /api/imports/plate`,
 * `scripts/import-plate.ts`): reads the file once, maps it with the template named, else the template
 * whose header fingerprint the file shows, else the guessed mapping, checks it as the check step does,
 * and stores the plate when the check finds no error. Stored either as an import job a worker runs (the
 * route: no import CPU in the processes that serve pages) or in the calling process (the script).
 */

/** One file to import: the screen and template by name or id (or a mapping given whole), an optional label. */
export interface ImportOnceRequest {
  screen: string;
  template?: string | undefined;
  /** A complete mapping applied as given (`scripts/import-plate.ts --mapping`); not with `template`. */
  mapping?: ColumnMapping | undefined;
  label?: string | undefined;
  file: Pick<Upload, 'bytes' | 'filename' | 'mediaType'>;
}

/** A file checked: its facts, the screen, and what a commit of it sends (null when the check found errors). */
export interface CheckedImport {
  screenId: string;
  facts: FileImportFacts;
  preview: ImportPreview;
  commit: {
    upload: Upload & { parsed: ParsedFile };
    sheet: string;
    mapping: ColumnMapping;
    label: string;
  } | null;
}

/** The screen by id or name (case-blind). */
export async function findScreen(screen: string): Promise<{ id: string; name: string }> {
  db();
  const key = screen.trim();
  const found = z.uuid().safeParse(key).success
    ? await Screen.findByPk(key)
    : await Screen.findOne({ where: db().where(db().fn('lower', db().col('name')), key.toLowerCase()) });
  if (!found) throw new AppError('not_found', `No screen named or numbered "${key}".`);
  return { id: found.id, name: found.name };
}

/** The template by id or name (case-blind). */
async function findTemplate(actor: Actor, template: string): Promise<TemplateSummary> {
  const key = template.trim();
  const found = (await listTemplates(actor)).find(
    (t) => t.id === key || t.name.toLowerCase() === key.toLowerCase(),
  );
  if (!found) throw new AppError('not_found', `No import template named or numbered "${key}".`);
  return found;
}

/** The sheet a template reads: the one showing its fingerprint, else the sheet it names, else the first. */
function templateSheet(template: TemplateSummary, sheets: readonly SheetData[]): SheetData {
  const matched = matchTemplate([template], sheets);
  const name = matched?.sheet ?? template.mapping.wellSheet;
  return sheets.find((s) => s.name === name) ?? sheets[0]!;
}

/**
 * The sheet and mapping: the mapping given, else the template named, else the one the file's fingerprint
 * shows, else the guess.
 */
async function chooseMapping(actor: Actor, sheets: readonly SheetData[], request: ImportOnceRequest) {
  if (request.mapping) {
    if (request.template) throw new AppError('invalid', 'Give a mapping or a template, not both.');
    const given = sheetForMapping(sheets, request.mapping);
    if ('refused' in given) throw new AppError('invalid', given.refused);
    return { ...given, template: null };
  }
  const templateName = request.template;
  const templates = templateName ? [await findTemplate(actor, templateName)] : await listTemplates(actor);
  const chosen = templateName ? templates[0]! : matchTemplate(templates, sheets)?.template;
  if (chosen) {
    const sheet = templateSheet(chosen, sheets);
    const mapping = columnMappingDraftSchema.parse({ ...chosen.mapping, wellSheet: sheet.name });
    return { sheet, mapping, template: chosen.name };
  }
  return { ...guessSheet(sheets), template: null };
}

/** Reads the file once and checks it against the screen's targets and the registry; stores nothing. */
export async function checkImportOnce(actor: Actor, request: ImportOnceRequest): Promise<CheckedImport> {
  requireCapability(actor, 'importPlates');
  const screen = await findScreen(request.screen);
  const upload = await readOnce({ ...request.file, screenId: screen.id });
  const { sheet, mapping, template } = await chooseMapping(actor, upload.parsed.sheets, request);
  const { preview, plates } = await checkImport(actor, { ...upload, sheet: sheet.name, mapping });
  const several = plates.length > 1;
  const unused = `The label given (${request.label}) was not used: the file holds several plates, each labelled by its own barcode, sheet or plate column.`;
  const facts = plates.length
    ? joinPlateFacts(
        plates.map((plate) => {
          const found = importFacts({
            filename: upload.filename,
            sheet: plate.part.sheet,
            mapping: plate.part.mapping,
            template,
            // A file of several plates labels each by its barcode, sheet or plate column; --label is one plate's.
            label: several
              ? { plateLabel: plate.label.label, labelSource: plate.label.labelSource }
              : plateLabel(request.label, plate.preview.facts, upload.filename),
            preview: plate.preview,
            factWarnings: plate.preview.factWarnings,
            rulesNotApplied: plate.qcRulesNotApplied,
            offline: false,
          });
          if (several && request.label) found.warnings.push(unused);
          return { key: plate.part.key, ...found };
        }),
      )
    : unreadFileFacts({
        filename: upload.filename,
        sheet: sheet.name,
        template,
        label: plateLabel(request.label, {}, upload.filename),
        errors: preview.fileProblems.map((p) => `${p.message} ${p.whatToDo}`),
        offline: false,
      });
  const label = { plateLabel: facts.plateLabel };
  const clean = preview.ok && preview.plate !== null && facts.errors.length === 0;
  return {
    screenId: screen.id,
    facts,
    preview,
    commit: clean ? { upload, sheet: sheet.name, mapping, label: label.plateLabel } : null,
  };
}

/** The refusal of a file whose check found errors, in the shape the commit route refuses it. */
function refusal(checked: CheckedImport): AppError {
  const { preview, facts } = checked;
  return new AppError(
    'invalid',
    `The file was not stored: the check found ${facts.errors.length} error(s); first: ${facts.errors[0] ?? 'no wells.'}`,
    {
      fileProblems: preview.fileProblems,
      issues: preview.issues.slice(0, 200),
      unknownCompounds: preview.unknownCompounds,
      unknownTargets: preview.unknownTargets,
      facts,
    },
  );
}

export type ImportOnceResult =
  | { state: 'stored'; plateId: string; plates: StoredPlate[]; facts: FileImportFacts }
  | { state: 'storing'; jobId: string; facts: FileImportFacts };

/**
 * Checks the file and, when the check is clean, stores the plate: `via: 'job'` keeps the parsed file as an
 * import draft and queues its commit for a worker (the file is not parsed again), `via: 'here'` commits in
 * this process. A file with errors is refused (422, `details.facts` and the problems); nothing is stored.
 */
export async function importOnce(
  actor: Actor,
  request: ImportOnceRequest,
  options: { via: 'job' | 'here'; slot?: <T>(work: () => Promise<T>) => Promise<T> },
): Promise<ImportOnceResult> {
  // Only the reading and checking take an import slot (lib/imports/import-slots.ts), not the wait for a worker.
  const slot = options.slot ?? (<T>(work: () => Promise<T>) => work());
  const checked = await slot(() => checkImportOnce(actor, request));
  if (!checked.commit) throw refusal(checked);
  const { upload, sheet, mapping, label } = checked.commit;
  const choice = { sheet, mapping, label };
  // Refused before anything is kept, in the words the store refuses it with.
  const duplicate = await findDuplicateUpload(checked.screenId, upload.parsed.sha256);
  if (duplicate)
    throw new AppError(
      'conflict',
      `This exact file was already imported for this screen as plate ${duplicate.label}.`,
      { plateId: duplicate.plateId, facts: checked.facts },
    );
  if (options.via === 'here') {
    const { plateId, plates } = await commitImport(actor, { ...upload, ...choice });
    return { state: 'stored', plateId, plates, facts: checked.facts };
  }
  const draft = await createDraft(actor, {
    ...upload,
    sha256: upload.parsed.sha256,
    sheets: upload.parsed.sheets,
  });
  const jobId = await queueImport(actor, { draftId: draft.id, ...choice });
  const result = await awaitImport(jobId);
  return { ...result, facts: checked.facts };
}
