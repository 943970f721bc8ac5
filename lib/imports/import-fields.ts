// The fields a plate export's columns can be mapped to.

/** Every field a column may be mapped to, in the order the mapping form shows them. */
export const IMPORT_FIELDS = [
  'well',
  'compound',
  'concentration',
  'concentrationUnit',
  'target',
  'controlCurrent',
  'compoundCurrent',
  'block',
  'useDependentControlCurrent',
  'useDependentCompoundCurrent',
  'useDependentBlock',
  'currentUnit',
  'sealResistance',
  'seriesResistance',
  'capacitance',
  'role',
] as const;

export type ImportField = (typeof IMPORT_FIELDS)[number];

/**
 * Fields that need a column; the target may instead be one name for the whole sheet, and the block
 * given directly stands in for the currents (see `fieldNeeded`).
 */
export const REQUIRED_FIELDS: readonly ImportField[] = [
  'well',
  'compound',
  'concentration',
  'target',
  'controlCurrent',
  'compoundCurrent',
];

/** Fields whose unit is part of the mapping, and so may be read from the header ("Conc (nM)"). */
export const UNIT_FIELDS = [
  'concentration',
  'controlCurrent',
  'compoundCurrent',
  'useDependentControlCurrent',
  'useDependentCompoundCurrent',
  'sealResistance',
  'seriesResistance',
  'capacitance',
] as const;

export type UnitField = (typeof UNIT_FIELDS)[number];

/** Names of fields as people read them in messages. */
export const FIELD_LABEL: Record<ImportField, string> = {
  well: 'well position',
  compound: 'compound identifier',
  concentration: 'concentration',
  concentrationUnit: 'concentration unit',
  target: 'target',
  controlCurrent: 'control current',
  compoundCurrent: 'compound current',
  block: 'block',
  useDependentControlCurrent: 'use-dependent control current',
  useDependentCompoundCurrent: 'use-dependent compound current',
  useDependentBlock: 'use-dependent block',
  currentUnit: 'current unit',
  sealResistance: 'seal resistance',
  seriesResistance: 'series resistance',
  capacitance: 'capacitance',
  role: 'well role',
};

/** What decides whether a required field may go without a column. */
interface MappingChoices {
  columns: Readonly<Partial<Record<ImportField, string | null>>>;
  fixedTarget: string | null;
}

/**
 * Whether a field needs a column under a mapping: the required fields, except the target when one target
 * is named for the whole sheet, and the currents when the block is given directly (the control current
 * is then read where mapped, for QC).
 */
export function fieldNeeded(field: ImportField, mapping: MappingChoices): boolean {
  if (!REQUIRED_FIELDS.includes(field)) return false;
  if (field === 'target') return mapping.fixedTarget === null;
  if (field === 'controlCurrent' || field === 'compoundCurrent') return !mapping.columns.block;
  return true;
}

/**
 * The columns of a second, use-dependent block readout (issue 20 point 2): the n-th pulse of a train or a
 * depolarised holding potential. The main control current, compound current and block columns are the
 * tonic readout (a target's only readout when these are not mapped); a use-dependent compound current
 * without a control current of its own is read against the tonic one's control current.
 */
export const USE_DEPENDENT_FIELD = {
  controlCurrent: 'useDependentControlCurrent',
  compoundCurrent: 'useDependentCompoundCurrent',
  block: 'useDependentBlock',
} as const satisfies Partial<Record<ImportField, ImportField>>;

/** Whether the mapping maps a use-dependent readout (its block or its compound current). */
export function mapsUseDependent(columns: Readonly<Partial<Record<ImportField, string | null>>>): boolean {
  return Boolean(columns.useDependentBlock || columns.useDependentCompoundCurrent);
}

/** How the block is written when a file gives it directly: a fraction (0.5) or percent inhibition (50). */
export const BLOCK_SCALES = ['fraction', 'percent'] as const;
export type BlockScale = (typeof BLOCK_SCALES)[number];

/** Facts about the plate that a file may give outside its table (lib/imports/plate-facts.ts). */
export const PLATE_FACTS = ['barcode', 'runDate', 'cellLine', 'temperature', 'operator'] as const;

export type PlateFact = (typeof PLATE_FACTS)[number];

/** Names of plate facts as people read them. */
export const PLATE_FACT_LABEL: Record<PlateFact, string> = {
  barcode: 'plate barcode',
  runDate: 'run date',
  cellLine: 'cell line',
  temperature: 'temperature',
  operator: 'operator',
};
