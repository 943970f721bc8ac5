// The imagined demo rig's export layouts (Gatewell's own invention): which sheets, rows and columns a file has.
import { fromCanonical } from '@/lib/imports/units';
import type { Cell } from '@/lib/imports/spreadsheet-types';
import type { DemoWell } from './simulate-plate';
import type { LayoutName, PlatePlan } from './plate-plans';

/** A sheet as the export writes it. */
export interface DemoSheet {
  name: string;
  rows: Cell[][];
}

/** The sheets of an export and where its plate data sit. */
export interface DemoExport {
  sheets: DemoSheet[];
  dataSheet: string;
  /** 1-based header row of the data sheet. */
  headerRow: number;
}

interface ColumnSpec {
  header: string;
  value: (well: DemoWell) => Cell;
}

const ROLE_WORD = { vehicle: 'vehicle', reference: 'reference', test: 'test' } as const;
const ROLE_CODE = { vehicle: 'VEH', reference: 'REF', test: 'TEST' } as const;
const nA = (pa: number | null) => (pa === null ? null : fromCanonical(pa, 'nA', 'current'));

const FLAT_SHEET: ColumnSpec[] = [
  { header: 'Well', value: (w) => w.position },
  { header: 'Compound', value: (w) => w.compound },
  {
    header: 'Conc (nM)',
    value: (w) =>
      w.concentration_uM === null ? null : fromCanonical(w.concentration_uM, 'nM', 'concentration'),
  },
  { header: 'Target', value: (w) => w.target },
  { header: 'I control [pA]', value: (w) => w.controlCurrent_pA },
  { header: 'I compound [pA]', value: (w) => w.compoundCurrent_pA },
  { header: 'Rseal (GOhm)', value: (w) => w.sealResistance_GOhm },
  { header: 'Rs (MOhm)', value: (w) => w.seriesResistance_MOhm },
  { header: 'Cm (pF)', value: (w) => w.capacitance_pF },
  { header: 'Role', value: (w) => ROLE_WORD[w.role] },
];

const RUN_WORKBOOK: ColumnSpec[] = [
  { header: 'Position', value: (w) => w.position.replace(/^([A-Z]+)0*(\d)/, '$1$2') },
  { header: 'Cmpd ID', value: (w) => w.compound },
  { header: 'Concentration', value: (w) => w.concentration_uM },
  { header: 'Conc unit', value: (w) => (w.concentration_uM === null ? null : 'µM') },
  { header: 'Channel', value: (w) => w.target },
  { header: 'Pre current (nA)', value: (w) => nA(w.controlCurrent_pA) },
  { header: 'Post current (nA)', value: (w) => nA(w.compoundCurrent_pA) ?? 'NA' },
  {
    header: 'Seal resistance (MOhm)',
    value: (w) =>
      w.sealResistance_GOhm === null ? null : fromCanonical(w.sealResistance_GOhm, 'MOhm', 'sealResistance'),
  },
  { header: 'Series resistance (MOhm)', value: (w) => w.seriesResistance_MOhm },
  { header: 'Capacitance (pF)', value: (w) => w.capacitance_pF },
];

const FLAT_TEXT: ColumnSpec[] = [
  { header: 'Well', value: (w) => w.position },
  { header: 'Well type', value: (w) => ROLE_CODE[w.role] },
  { header: 'Compound', value: (w) => w.compound },
  { header: 'Conc (µM)', value: (w) => w.concentration_uM },
  { header: 'Target', value: (w) => w.target },
  { header: 'I control (pA)', value: (w) => w.controlCurrent_pA },
  { header: 'I compound (pA)', value: (w) => w.compoundCurrent_pA },
  { header: 'Rseal (GΩ)', value: (w) => w.sealResistance_GOhm },
  { header: 'Rs (MΩ)', value: (w) => w.seriesResistance_MOhm },
  { header: 'Cm (pF)', value: (w) => w.capacitance_pF },
];

const SPECS: Record<LayoutName, ColumnSpec[]> = {
  'flat-sheet': FLAT_SHEET,
  'run-workbook': RUN_WORKBOOK,
  'flat-text': FLAT_TEXT,
};

/** Lays the simulated wells out as the plan's export layout. */
export function layOutExport(plan: PlatePlan, wells: DemoWell[]): DemoExport {
  const specs = SPECS[plan.layout];
  const table: Cell[][] = [
    specs.map((spec) => spec.header),
    ...wells.map((well) => specs.map((spec) => spec.value(well))),
  ];
  if (plan.layout !== 'run-workbook') {
    const name = plan.layout === 'flat-text' ? plan.file.replace(/\.[^.]+$/, '') : 'Readouts';
    return { sheets: [{ name, rows: table }], dataSheet: name, headerRow: 1 };
  }
  const runInfo: Cell[][] = [
    ['Gatewell demo rig: run export'],
    ['Plate', plan.plateName],
    ['Format', `${plan.format} wells`],
    ['Target', plan.target],
    ['Note', 'Invented demo data made by scripts/make-demo-plates.ts'],
  ];
  const readouts: Cell[][] = [
    [`Readouts of plate ${plan.plateName}`],
    [`${wells.length} wells recorded`],
    [],
    ...table,
  ];
  return {
    sheets: [
      { name: 'Run info', rows: runInfo },
      { name: 'Readouts', rows: readouts },
    ],
    dataSheet: 'Readouts',
    headerRow: 4,
  };
}
