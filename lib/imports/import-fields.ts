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
  'currentUnit',
  'sealResistance',
  'seriesResistance',
  'capacitance',
  'role',
] as const;

export type ImportField = (typeof IMPORT_FIELDS)[number];

/** Fields that need a column; the target may instead be one name for the whole sheet. */
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
  currentUnit: 'current unit',
  sealResistance: 'seal resistance',
  seriesResistance: 'series resistance',
  capacitance: 'capacitance',
  role: 'well role',
};

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
