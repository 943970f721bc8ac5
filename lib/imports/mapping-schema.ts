import { z } from 'zod';
import {
  DEFAULT_MARKERS,
  FIELD_LABEL,
  IMPORT_FIELDS,
  REQUIRED_FIELDS,
  type ImportField,
} from './import-fields';
import { normaliseLabel } from './normalise-text';
import { CAPACITANCE_UNITS, CONCENTRATION_UNITS, CURRENT_UNITS, RESISTANCE_UNITS } from './units';

const header = z.string().trim().min(1).max(200).nullable().default(null);
const markerList = (defaults: string[]) =>
  z
    .array(z.string().trim().min(1).max(100))
    .max(50)
    .default(() => [...defaults]);

/** Which header (as written in the header row) feeds each field; null when no column does. */
const columnsSchema = z.object(
  Object.fromEntries(IMPORT_FIELDS.map((field) => [field, header])) as Record<ImportField, typeof header>,
);

/** A column mapping that may still be incomplete, as guessed or while it is being edited. */
export const columnMappingDraftSchema = z.object({
  version: z.literal(1).default(1),
  /** 1-based row number of the header row, as the spreadsheet shows it. */
  headerRow: z.int().min(1).max(1000).default(1),
  columns: columnsSchema.prefault({}),
  /** Units of each quantity when the header or a unit column does not say otherwise. */
  units: z
    .object({
      concentration: z.enum(CONCENTRATION_UNITS).default('uM'),
      controlCurrent: z.enum(CURRENT_UNITS).default('pA'),
      compoundCurrent: z.enum(CURRENT_UNITS).default('pA'),
      sealResistance: z.enum(RESISTANCE_UNITS).default('GOhm'),
      seriesResistance: z.enum(RESISTANCE_UNITS).default('MOhm'),
      capacitance: z.enum(CAPACITANCE_UNITS).default('pF'),
    })
    .prefault({}),
  /** The target of every row, for exports of one target that have no target column. */
  fixedTarget: z.string().trim().min(1).max(100).nullable().default(null),
  /** Words marking vehicle, reference and test wells in the role column; vehicle and reference also as compound identifiers. */
  markers: z
    .object({
      vehicle: markerList(DEFAULT_MARKERS.vehicle),
      reference: markerList(DEFAULT_MARKERS.reference),
      test: markerList(DEFAULT_MARKERS.test),
    })
    .prefault({}),
});

/** A complete column mapping: every required field has a column and no column feeds two fields. */
export const columnMappingSchema = columnMappingDraftSchema.superRefine((mapping, ctx) => {
  for (const field of REQUIRED_FIELDS) {
    if (mapping.columns[field] !== null) continue;
    if (field === 'target' && mapping.fixedTarget !== null) continue;
    const extra = field === 'target' ? ', or name one target for the whole sheet' : '';
    ctx.addIssue({
      code: 'custom',
      path: ['columns', field],
      message: `Choose the column that holds the ${FIELD_LABEL[field]}${extra}.`,
    });
  }
  if (mapping.columns.target !== null && mapping.fixedTarget !== null) {
    ctx.addIssue({
      code: 'custom',
      path: ['fixedTarget'],
      message: 'Choose a target column or one target for the whole sheet, not both.',
    });
  }
  const seen = new Map<string, ImportField>();
  for (const field of IMPORT_FIELDS) {
    const chosen = mapping.columns[field];
    if (chosen === null) continue;
    const first = seen.get(normaliseLabel(chosen));
    if (first) {
      const message = `Column "${chosen}" is chosen for both the ${FIELD_LABEL[first]} and the ${FIELD_LABEL[field]}.`;
      ctx.addIssue({ code: 'custom', path: ['columns', field], message });
    } else seen.set(normaliseLabel(chosen), field);
  }
});

/** A named, saved mapping for one export layout, re-applied to later files. */
export const importTemplateSchema = z.object({
  name: z.string().trim().min(1, 'Give the template a name.').max(100, 'Keep the name under 100 characters.'),
  mapping: columnMappingSchema,
});

export type ColumnMapping = z.output<typeof columnMappingDraftSchema>;
export type ColumnMappingInput = z.input<typeof columnMappingDraftSchema>;
export type ImportTemplate = z.output<typeof importTemplateSchema>;
