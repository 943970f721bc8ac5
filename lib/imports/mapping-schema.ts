import { z } from 'zod';
import {
  BLOCK_SCALES,
  FIELD_LABEL,
  fieldNeeded,
  IMPORT_FIELDS,
  mapsUseDependent,
  PLATE_FACTS,
  REQUIRED_FIELDS,
  type ImportField,
  type PlateFact,
} from './import-fields';
import { normaliseLabel } from './normalise-text';
import { guessRoleValue, ROLE_CHOICES, type RoleChoice } from './role-words';
import { CAPACITANCE_UNITS, CONCENTRATION_UNITS, CURRENT_UNITS, RESISTANCE_UNITS } from './units';

const header = z.string().trim().min(1).max(200).nullable().default(null);
const valueText = z.string().trim().min(1).max(100);
const sheetName = z.string().trim().min(1).max(200);

/** Where a plate fact is written outside the table: one cell, or the value beside a key ("Barcode | XYZ123"). */
export const factLocatorSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('cell'),
    sheet: sheetName,
    address: z
      .string()
      .trim()
      .toUpperCase()
      .regex(
        /^\$?[A-Z]{1,3}\$?[1-9][0-9]{0,6}$/,
        'Write the cell as a column letter and row number, like B2.',
      ),
  }),
  z.object({
    kind: z.literal('key'),
    /** The sheet to look in; null looks in every sheet. */
    sheet: sheetName.nullable().default(null),
    key: valueText,
  }),
]);

const factsSchema = z.object(
  Object.fromEntries(PLATE_FACTS.map((fact) => [fact, factLocatorSchema.nullable().default(null)])) as Record<
    PlateFact,
    z.ZodDefault<z.ZodNullable<typeof factLocatorSchema>>
  >,
);

/** Which header (as written in the header row) feeds each field; null when no column does. */
const columnsSchema = z.object(
  Object.fromEntries(IMPORT_FIELDS.map((field) => [field, header])) as Record<ImportField, typeof header>,
);

/**
 * How the sheet lays out its wells (lib/imports/reshape-table.ts). `long`: one row per well and target.
 * `wide`: one row per well with a block of columns per target, the block's headers opening with the
 * target as the file writes it ("SCN9A I0 (pA)", "SCN9A block"). `grid`: plate-shaped blocks, one per
 * readout, each under a title with column numbers above and row letters beside it, starting at the
 * header row; `constants` are keys of the key/value lines above the grids ("Target | Nav 1.7") read as
 * a column holding that value in every well.
 */
export const layoutSchema = z
  .discriminatedUnion('kind', [
    z.object({ kind: z.literal('long') }),
    z.object({ kind: z.literal('wide'), targets: z.array(valueText).min(1).max(50) }),
    z.object({ kind: z.literal('grid'), constants: z.array(valueText).max(20).default([]) }),
  ])
  .default({ kind: 'long' });

/**
 * How many plates the file holds (lib/imports/split-plates.ts): `one` (the chosen sheet is one plate),
 * `sheet` (every sheet showing the chosen sheet's header row is a plate of its own) or `column` (the
 * distinct values of `column`, a plate barcode or plate-id column, split the rows into plates).
 */
export const plateSplitSchema = z
  .object({
    by: z.enum(['one', 'sheet', 'column']).default('one'),
    /** The header of the plate column (for `column`); null otherwise. */
    column: header,
  })
  .prefault({});

/** A column mapping as it is stored (version 2), before defaults. */
const mappingObjectSchema = z.object({
  version: z.literal(2).default(2),
  /** The sheet that holds the wells, when the layout names one (a template keeps it); null: the chosen sheet. */
  wellSheet: sheetName.nullable().default(null),
  /**
   * How the well column names wells: `label` (A1, A01), `index` (a running number along the rows, A1 = 1)
   * or `guess` (a whole number is a running index, anything else a label).
   */
  wellNames: z.enum(['guess', 'label', 'index']).default('guess'),
  /**
   * How compound reaches a cell: `single` (one concentration per well; a well's second row of a target is
   * an error), `cumulative` (several concentrations in turn, a row each) or `guess` (rows of one well and
   * target that differ only in concentration are cumulative applications).
   */
  application: z.enum(['guess', 'single', 'cumulative']).default('guess'),
  /**
   * Missing values: `NaN` read as missing (by default an error; the guess sets it where NaN fills cells of
   * several rows), and more words meaning "no value" in this layout besides Gatewell's own (NA, n/a, -, …).
   */
  missing: z
    .object({
      notANumber: z.boolean().default(false),
      words: z.array(valueText).max(20).default([]),
    })
    .prefault({}),
  /** How the sheet lays out its wells; older mappings are long. */
  layout: layoutSchema,
  /**
   * 1-based row number of the header row, as the spreadsheet shows it; for grids, the row of the first
   * grid's title (key/value lines above it, the grids from there down).
   */
  headerRow: z.int().min(1).max(1000).default(1),
  columns: columnsSchema.prefault({}),
  /** Units of each quantity when the header or a unit column does not say otherwise. */
  units: z
    .object({
      concentration: z.enum(CONCENTRATION_UNITS).default('uM'),
      controlCurrent: z.enum(CURRENT_UNITS).default('pA'),
      compoundCurrent: z.enum(CURRENT_UNITS).default('pA'),
      /** Units of the use-dependent currents; left out: those of the tonic currents. */
      useDependentControlCurrent: z.enum(CURRENT_UNITS).optional(),
      useDependentCompoundCurrent: z.enum(CURRENT_UNITS).optional(),
      sealResistance: z.enum(RESISTANCE_UNITS).default('GOhm'),
      seriesResistance: z.enum(RESISTANCE_UNITS).default('MOhm'),
      capacitance: z.enum(CAPACITANCE_UNITS).default('pF'),
      /**
       * The block given directly: a fraction (0.5) or percent inhibition (50); `guess` reads "%" or
       * "percent" in its header, else percent when any value lies beyond ±2 (no fraction does).
       */
      block: z.enum(['guess', ...BLOCK_SCALES]).default('guess'),
    })
    .prefault({}),
  /** The target of every row, for exports of one target that have no target column. */
  fixedTarget: z.string().trim().min(1).max(100).nullable().default(null),
  /**
   * The value map of the role column: each value as the file writes it → negative control (vehicle),
   * positive control (reference), test, or empty (the row is skipped). Values not in it are guessed
   * from common words (lib/imports/role-words.ts); a value neither mapped nor guessed stops the import.
   */
  roleValues: z
    .record(valueText, z.enum(ROLE_CHOICES))
    .refine((map) => Object.keys(map).length <= 500, 'Map at most 500 role values.')
    .default({}),
  /** Wells whose compound identifier names a control, for files whose rows say nothing of the role. */
  controls: z
    .object({
      negative: z.array(valueText).max(200).default([]),
      positive: z.array(valueText).max(200).default([]),
      /** A well at concentration 0 (or none written) is a negative control. */
      zeroConcentration: z.boolean().default(false),
    })
    .prefault({}),
  /** The file's target values → the screen's target names (also remembered per screen on import). */
  targetValues: z
    .record(valueText, z.string().trim().min(1).max(100))
    .refine((map) => Object.keys(map).length <= 200, 'Map at most 200 target values.')
    .default({}),
  /** Where the plate barcode and the other plate facts are written outside the table. */
  facts: factsSchema.prefault({}),
  /** How many plates the file holds; older mappings hold one. */
  plates: plateSplitSchema,
  /** Rows of the table that are not wells (lib/imports/skip-rows.ts). */
  rows: z
    .object({
      /**
       * A row of units right under the header: `guess` skips it when every filled cell is a unit
       * ("mM", "[nA]", "MΩ", "%"); `yes` always skips that row; `no` reads it as a well.
       */
      unitsRow: z.enum(['guess', 'yes', 'no']).default('guess'),
      /** Skip rows that name no well and open with a summary word (mean, count, SD …). */
      skipSummaryRows: z.boolean().default(true),
      /** More words that open a summary row in this layout, besides Gatewell's own. */
      summaryWords: z.array(valueText).max(50).default([]),
    })
    .prefault({}),
});

/**
 * Upgrades a mapping of version 1: its `markers` (words per role, in the role column or as the compound
 * identifier) become entries of the value map and control compounds, except words Gatewell guesses the
 * same way anyway.
 */
function upgrade(input: unknown): unknown {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) return input;
  const { markers, version, ...rest } = input as Record<string, unknown>;
  if (version !== 1 && markers === undefined) return input;
  const roleValues: Record<string, RoleChoice> = {};
  const controls = { negative: [] as string[], positive: [] as string[] };
  if (typeof markers === 'object' && markers !== null) {
    for (const role of ['vehicle', 'reference', 'test'] as const) {
      const words = (markers as Record<string, unknown>)[role];
      if (!Array.isArray(words)) continue;
      for (const word of words) {
        if (typeof word !== 'string' || word.trim() === '' || guessRoleValue(word) === role) continue;
        roleValues[word.trim()] ??= role;
        if (role === 'vehicle') controls.negative.push(word.trim());
        if (role === 'reference') controls.positive.push(word.trim());
      }
    }
  }
  const upgraded: Record<string, unknown> = { ...rest, version: 2 };
  if (Object.keys(roleValues).length > 0)
    upgraded.roleValues = { ...roleValues, ...(rest.roleValues as object) };
  if (controls.negative.length + controls.positive.length > 0) upgraded.controls = controls;
  return upgraded;
}

/** A column mapping that may still be incomplete, as guessed or while it is being edited (version 1 is upgraded). */
export const columnMappingDraftSchema = z.preprocess(upgrade, mappingObjectSchema);

/** A complete column mapping: every required field has a column and no column feeds two fields. */
export const columnMappingSchema = columnMappingDraftSchema.superRefine((mapping, ctx) => {
  for (const field of REQUIRED_FIELDS) {
    if (mapping.columns[field] !== null || !fieldNeeded(field, mapping)) continue;
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
  if (mapping.columns.useDependentControlCurrent !== null && !mapsUseDependent(mapping.columns)) {
    ctx.addIssue({
      code: 'custom',
      path: ['columns', 'useDependentCompoundCurrent'],
      message: 'Choose the use-dependent compound current or block beside its control current.',
    });
  }
  if (mapping.plates.by === 'column' && mapping.plates.column === null) {
    ctx.addIssue({
      code: 'custom',
      path: ['plates', 'column'],
      message: 'Choose the column that names the plate of each row.',
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

export type ColumnMapping = z.output<typeof mappingObjectSchema>;
/** A mapping as sent or stored: version 2 with defaults left out (a version 1 mapping parses too). */
export type ColumnMappingInput = z.input<typeof mappingObjectSchema>;
export type FactLocator = z.output<typeof factLocatorSchema>;
export type SheetLayout = z.output<typeof layoutSchema>;
export type PlateSplit = z.output<typeof plateSplitSchema>;
export type ImportTemplate = z.output<typeof importTemplateSchema>;
