import { z } from 'zod';

const optionalNumber = (schema: z.ZodNumber) =>
  z.preprocess(
    (value) => (value === '' || value === null || value === undefined ? null : value),
    z.coerce.number({ error: 'Enter a number.' }).pipe(schema).nullable(),
  );

/** A compound as a chemist registers or edits it. */
export const compoundSchema = z.object({
  identifier: z
    .string()
    .trim()
    .min(1, 'Enter the compound identifier.')
    .max(64, 'Identifiers are at most 64 characters.')
    .regex(
      /^[A-Za-z0-9][A-Za-z0-9_.-]*$/,
      'Use letters, digits, dot, dash or underscore, starting with a letter or digit.',
    ),
  name: z.string().trim().max(200, 'Names are at most 200 characters.').default(''),
  smiles: z
    .string()
    .trim()
    .max(2000, 'SMILES is at most 2000 characters.')
    .regex(
      /^[A-Za-z0-9@+\-[\]()=#$%./\\:*~]*$/,
      'SMILES may hold only atom, bond, ring and branch characters.',
    )
    .default(''),
  molecularWeight: optionalNumber(
    z
      .number()
      .positive('Molecular weight must be above 0.')
      .max(10_000, 'Molecular weight above 10 000 g/mol is not a small molecule.'),
  ),
});

export type CompoundInput = z.infer<typeof compoundSchema>;

/** A batch (lot) of a compound. */
export const batchSchema = z.object({
  lot: z.string().trim().min(1, 'Enter the batch or lot.').max(64, 'Lots are at most 64 characters.'),
  purity_percent: optionalNumber(
    z.number().gt(0, 'Purity must be above 0 %.').max(100, 'Purity cannot exceed 100 %.'),
  ),
  stockConcentration_mM: optionalNumber(z.number().positive('Stock concentration must be above 0 mM.')),
  solvent: z.string().trim().min(1, 'Enter the solvent.').max(40).default('DMSO'),
});

export type BatchInput = z.infer<typeof batchSchema>;

/** One row of a bulk registration: the compound and, optionally, its first batch. */
export const bulkCompoundRowSchema = compoundSchema.extend({
  lot: z.string().trim().max(64).default(''),
  purity_percent: batchSchema.shape.purity_percent,
  stockConcentration_mM: batchSchema.shape.stockConcentration_mM,
  solvent: z.string().trim().max(40).default('DMSO'),
});

export type BulkCompoundRow = z.infer<typeof bulkCompoundRowSchema>;
