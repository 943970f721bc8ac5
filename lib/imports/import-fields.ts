// The fields a plate export's columns can be mapped to.
import type { WellRole } from '@/lib/domain/well-roles';

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

/** Default words that mark each well role (lib/domain/well-roles.ts), in a role column or as the compound identifier. */
export const DEFAULT_MARKERS: Record<WellRole, string[]> = {
  vehicle: ['VEH', 'VEHICLE', 'DMSO', 'NEG', 'NEGATIVE'],
  reference: ['REF', 'REFERENCE', 'POS', 'POSITIVE'],
  test: ['TEST', 'SAMPLE', 'CMPD', 'COMPOUND'],
};
