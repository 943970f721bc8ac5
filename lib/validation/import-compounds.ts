import { z } from 'zod';
import { columnMappingDraftSchema } from '@/lib/imports/mapping-schema';
import { plateLabelsJson, plateLabelsSchema, previewFieldsSchema } from './imports';

/** A file's compound identifier as the check step sends it back (the file's own text). */
const fileName = z
  .string()
  .trim()
  .min(1, 'An identifier is empty.')
  .max(64, 'Identifiers and aliases are at most 64 characters.');

/**
 * What to do with the compound identifiers of a file that the registry lacks: register each (with an
 * optional first batch) or map it to a registered compound as an alias. A draft names the import it came from.
 */
export const unknownCompoundsSchema = z
  .object({
    draftId: z.uuid().optional(),
    register: z
      .array(
        z.object({
          identifier: fileName,
          lot: z.string().trim().max(64, 'Lots are at most 64 characters.').default(''),
        }),
      )
      .max(1000)
      .default([]),
    aliases: z
      .array(
        z.object({
          alias: fileName,
          compoundIdentifier: z.string().trim().min(1, 'Name the registered compound of each alias.').max(64),
        }),
      )
      .max(1000)
      .default([]),
  })
  .refine((v) => v.register.length + v.aliases.length > 0, 'Choose what to do with at least one identifier.');
export type UnknownCompoundsInput = z.input<typeof unknownCompoundsSchema>;

/** The wait request: the preview's fields and the label chosen so far. */
export const waitFieldsSchema = previewFieldsSchema.extend({
  label: z.string().trim().max(120).default(''),
  /** For a file of several plates: each plate's label by its key, as JSON. */
  labels: plateLabelsJson,
});

/** The choices a waiting draft keeps to resume with (import_drafts.waiting_choice). */
export const waitingChoiceSchema = z.object({
  sheet: z.string().min(1).max(200),
  mapping: columnMappingDraftSchema,
  format: z.literal([96, 384, 1536]).optional(),
  label: z.string().max(120),
  /** Labels of a file's plates by their key, for a file of several plates. */
  labels: plateLabelsSchema.optional(),
});
export type WaitingChoice = z.infer<typeof waitingChoiceSchema>;

/** A draft named by its id (resume, discard). */
export const draftIdSchema = z.object({ draftId: z.uuid('Name the waiting import.') });
