import { z } from 'zod';
import { columnMappingDraftSchema } from '@/lib/imports/mapping-schema';

/** Largest upload Gatewell accepts, bytes (10 MB, as the import design says). */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

const mappingJson = z
  .string()
  .transform((text, ctx) => {
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'The column mapping is not valid JSON.' });
      return z.NEVER;
    }
  })
  .pipe(columnMappingDraftSchema);

/** Fields of the inspect request besides the file. */
export const inspectFieldsSchema = z.object({
  screenId: z.uuid('Choose a screen.'),
});

/** The draft inspect answered: preview and commit name it instead of sending the file again. */
const draftIdField = z.uuid('Read the file first: send the draftId that inspect answered.');

/** The sheet, mapping and plate format of a preview or commit. */
const sheetFields = {
  sheet: z.string().min(1, 'Choose a sheet.').max(200),
  mapping: mappingJson,
  format: z
    .enum(['', '96', '384', '1536'])
    .default('')
    .transform((v) => (v === '' ? undefined : (Number(v) as 96 | 384 | 1536))),
};

/** Labels of a file's plates by their key (sheet name or plate-column value), for a file of several plates. */
export const plateLabelsSchema = z
  .record(
    z.string().max(200),
    z.string().trim().min(1, 'Give every plate a label (its barcode or name).').max(120),
  )
  .refine((labels) => Object.keys(labels).length <= 50, 'Label at most 50 plates.');

export const plateLabelsJson = z
  .string()
  .optional()
  .transform((text, ctx) => {
    if (!text) return undefined;
    try {
      return JSON.parse(text) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'The plate labels are not valid JSON.' });
      return z.NEVER;
    }
  })
  .pipe(plateLabelsSchema.optional());

/** What a commit adds to a preview: the plate's label, a template to save, a plate it supersedes. */
const commitOnlyFields = {
  label: z.string().trim().min(1, 'Give the plate a label (its barcode or name).').max(120),
  /** For a file of several plates: each plate's label by its key, as JSON (else each plate's own). */
  labels: plateLabelsJson,
  templateName: z
    .string()
    .trim()
    .max(100)
    .optional()
    .transform((v) => (v ? v : undefined)),
  supersedesPlateId: z
    .union([z.uuid(), z.literal('')])
    .optional()
    .transform((v) => (v ? v : undefined)),
};

/** Fields of the preview request: the draft, sheet, mapping and format (no file). */
export const previewFieldsSchema = z.object({ draftId: draftIdField, ...sheetFields });

/** Fields of the commit request that names a draft (no file). */
export const commitFieldsSchema = previewFieldsSchema.extend(commitOnlyFields);

/** Fields of the commit request that sends the file itself (scripts, the load test): the screen instead of a draft. */
export const commitFileFieldsSchema = inspectFieldsSchema.extend({ ...sheetFields, ...commitOnlyFields });

/** The commit fields kept with a queued commit (import_uploads.request), checked again when a worker reads them. */
const storedCommitFields = {
  sheet: z.string().min(1).max(200),
  mapping: columnMappingDraftSchema,
  format: z.literal([96, 384, 1536]).optional(),
  label: z.string().min(1).max(120),
  labels: plateLabelsSchema.optional(),
  templateName: z.string().max(100).optional(),
  supersedesPlateId: z.uuid().optional(),
};

/**
 * The commit request kept with a queued upload (import_uploads.request): the commit's fields and the
 * file's screen, name and type, without its bytes. Checked again when a worker reads it back.
 */
export const storedImportRequestSchema = z.object({
  screenId: z.uuid(),
  filename: z.string().max(255),
  mediaType: z.string(),
  ...storedCommitFields,
});
export type StoredImportRequest = z.input<typeof storedImportRequestSchema>;

/** The commit request kept with a queued commit of a draft (import_uploads.draft_id names the draft). */
export const storedDraftCommitSchema = z.object(storedCommitFields);
export type StoredDraftCommit = z.input<typeof storedDraftCommitSchema>;

type DraftCell = string | number | boolean | null;

/** True when every row is an array of plain cells (text, finite numbers, booleans, null); a loop, as a sheet may hold millions. */
function isPlainRows(rows: unknown): rows is DraftCell[][] {
  if (!Array.isArray(rows)) return false;
  for (const row of rows as unknown[]) {
    if (!Array.isArray(row)) return false;
    for (const cell of row as unknown[]) {
      if (
        cell !== null &&
        typeof cell !== 'string' &&
        typeof cell !== 'boolean' &&
        !(typeof cell === 'number' && Number.isFinite(cell))
      )
        return false;
    }
  }
  return true;
}

/** The parsed sheets a draft keeps (import_drafts.sheets), checked when read back from the database. */
export const draftSheetsSchema = z
  .array(
    z.object({
      name: z.string(),
      rows: z.custom<DraftCell[][]>(
        isPlainRows,
        'A sheet row holds something other than text, numbers, booleans or blanks.',
      ),
      decimalComma: z.boolean(),
    }),
  )
  .min(1);

/** A draft's row as read back (without its sheets and bytes). */
export const draftRecordSchema = z.object({
  id: z.uuid(),
  ownerId: z.uuid(),
  screenId: z.uuid(),
  filename: z.string().min(1).max(255),
  mediaType: z.string(),
  sha256: z.string().regex(/^[0-9a-f]{64}$/),
  sizeBytes: z.int().positive(),
  expiresAt: z.date(),
  consumedAt: z.date().nullable(),
  plateId: z.uuid().nullable(),
});

/** Fields of the one-request import (`POST /api/imports/plate`) besides the file. */
export const importOnceFieldsSchema = z.object({
  screen: z.string().trim().min(1, 'Name the screen (its name or id).').max(200),
  template: z
    .string()
    .trim()
    .max(200)
    .optional()
    .transform((v) => (v ? v : undefined)),
  label: z
    .string()
    .trim()
    .max(120)
    .optional()
    .transform((v) => (v ? v : undefined)),
});
