// Units Gatewell accepts in plate exports, and conversion to the canonical unit of each quantity.

export const CONCENTRATION_UNITS = ['pM', 'nM', 'uM', 'mM', 'M'] as const;
export const CURRENT_UNITS = ['pA', 'nA'] as const;
export const RESISTANCE_UNITS = ['MOhm', 'GOhm'] as const;
export const CAPACITANCE_UNITS = ['pF', 'nF'] as const;

export type ConcentrationUnit = (typeof CONCENTRATION_UNITS)[number];
export type CurrentUnit = (typeof CURRENT_UNITS)[number];
export type ResistanceUnit = (typeof RESISTANCE_UNITS)[number];
export type CapacitanceUnit = (typeof CAPACITANCE_UNITS)[number];
export type Unit = ConcentrationUnit | CurrentUnit | ResistanceUnit | CapacitanceUnit;

/** What a number measures; seal and series resistance share units but not their canonical unit. */
export type QuantityKind =
  'concentration' | 'current' | 'sealResistance' | 'seriesResistance' | 'capacitance';

/** Canonical unit per quantity: concentration µM, current pA, seal GΩ, series MΩ, capacitance pF. */
export const CANONICAL_UNIT: Record<QuantityKind, Unit> = {
  concentration: 'uM',
  current: 'pA',
  sealResistance: 'GOhm',
  seriesResistance: 'MOhm',
  capacitance: 'pF',
};

/** Decimal exponent of each unit relative to its SI base unit (mol/L, A, Ω, F). */
const EXPONENT: Record<Unit, number> = {
  pM: -12,
  nM: -9,
  uM: -6,
  mM: -3,
  M: 0,
  pA: -12,
  nA: -9,
  MOhm: 6,
  GOhm: 9,
  pF: -12,
  nF: -9,
};

const UNITS_OF: Record<QuantityKind, readonly Unit[]> = {
  concentration: CONCENTRATION_UNITS,
  current: CURRENT_UNITS,
  sealResistance: RESISTANCE_UNITS,
  seriesResistance: RESISTANCE_UNITS,
  capacitance: CAPACITANCE_UNITS,
};

/** How people write each unit, after lower-casing, µ/μ → u, Ω → ohm and removing spaces and dots. */
const SPELLINGS: Record<Unit, string[]> = {
  pM: ['pm', 'pmol/l', 'picomolar'],
  nM: ['nm', 'nmol/l', 'nanomolar'],
  uM: ['um', 'umol/l', 'micromolar'],
  mM: ['mm', 'mmol/l', 'millimolar'],
  M: ['m', 'mol/l', 'molar'],
  pA: ['pa', 'picoamp', 'picoamps', 'picoampere', 'picoamperes'],
  nA: ['na', 'nanoamp', 'nanoamps', 'nanoampere', 'nanoamperes'],
  MOhm: ['mohm', 'mohms', 'megohm', 'megohms', 'megaohm', 'megaohms'],
  GOhm: ['gohm', 'gohms', 'gigohm', 'gigohms', 'gigaohm', 'gigaohms'],
  pF: ['pf', 'picofarad', 'picofarads'],
  nF: ['nf', 'nanofarad', 'nanofarads'],
};

/** Unit names as people read them. */
export const UNIT_LABEL: Record<Unit, string> = {
  pM: 'pM',
  nM: 'nM',
  uM: 'µM',
  mM: 'mM',
  M: 'M',
  pA: 'pA',
  nA: 'nA',
  MOhm: 'MΩ',
  GOhm: 'GΩ',
  pF: 'pF',
  nF: 'nF',
};

/** The units accepted for a quantity. */
export function unitsOf(kind: QuantityKind): readonly Unit[] {
  return UNITS_OF[kind];
}

/** Recognises a written unit ("nM", "µM", "[pA]", "GΩ", "MOhm") for a quantity; null if it is not one. */
export function parseUnit(text: string, kind: QuantityKind): Unit | null {
  const spelled = text
    .trim()
    .replace(/^[([{]\s*|\s*[)\]}]$/g, '')
    .replace(/[\u00b5\u03bc]/g, 'u')
    .replace(/[\u03a9\u2126]/g, 'ohm')
    .toLowerCase()
    .replace(/[\s.]/g, '');
  return UNITS_OF[kind].find((unit) => SPELLINGS[unit].includes(spelled)) ?? null;
}

/**
 * Converts a value in `unit` to the canonical unit of `kind`, rounded to 12 significant digits when
 * the unit changes so that 0.3 nM is 0.0003 µM, not 0.00030000000000000003.
 */
export function toCanonical(value: number, unit: Unit, kind: QuantityKind): number {
  const shift = EXPONENT[unit] - EXPONENT[CANONICAL_UNIT[kind]];
  if (shift === 0) return value;
  const scaled = shift > 0 ? value * 10 ** shift : value / 10 ** -shift;
  return Number(scaled.toPrecision(12));
}

/** The inverse of toCanonical, for writers of exports: a canonical value expressed in `unit`. */
export function fromCanonical(value: number, unit: Unit, kind: QuantityKind): number {
  const shift = EXPONENT[CANONICAL_UNIT[kind]] - EXPONENT[unit];
  if (shift === 0) return value;
  const scaled = shift > 0 ? value * 10 ** shift : value / 10 ** -shift;
  return Number(scaled.toPrecision(12));
}
