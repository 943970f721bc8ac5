import { z } from 'zod';
import { columnMappingDraftSchema } from '@/lib/imports/mapping-schema';

/** Largest upload Gatewell accepts, bytes (10 MB, as the import design says). */
export const MAX_UPLOAD_BYTES = 10 * 1024 * 1024;

const mappingJson = z.string().transform((text, ctx) => {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    ctx.addIssue({ code: 'custom', message: 'The column mapping is not valid JSON.' });
    return z.NEVER;
  }
}).pipe(columnMappingDraftSchema);

/** Fields of the inspect request besides the file. */
export const inspectFieldsSchema = z.object({
  screenId: z.uuid('Choose a screen.'),
});

/** Fields of the preview request besides the file. */
export const previewFieldsSchema = inspectFieldsSchema.extend({
  sheet: z.string().min(1, 'Choose a sheet.').max(200),
  mapping: mappingJson,
  format: z.enum(['', '96', '384', '1536']).default('').transform((v) => (v === '' ? undefined : (Number(v) as 96 | 384 | 1536))),
});

/** Fields of the commit request besides the file. */
export const commitFieldsSchema = previewFieldsSchema.extend({
  label: z.string().trim().min(1, 'Give the plate a label (its barcode or name).').max(120),
  templateName: z.string().trim().max(100).optional().transform((v) => (v ? v : undefined)),
  supersedesPlateId: z.union([z.uuid(), z.literal('')]).optional().transform((v) => (v ? v : undefined)),
});

/**
 * The commit request kept with a queued upload (import_uploads.request): the commit's fields and the
 * file's name and type, without its bytes. Checked again when a worker reads it back.
 */
export const storedImportRequestSchema = z.object({
  screenId: z.uuid(),
  filename: z.string().max(255),
  mediaType: z.string(),
  sheet: z.string().min(1).max(200),
  mapping: columnMappingDraftSchema,
  format: z.literal([96, 384, 1536]).optional(),
  label: z.string().min(1).max(120),
  templateName: z.string().max(100).optional(),
  supersedesPlateId: z.uuid().optional(),
});
export type StoredImportRequest = z.input<typeof storedImportRequestSchema>;
