// Simulates the recording of one demo plate: every well's truth and the values the export writes.
import { wellLabel } from '@/lib/imports/plate-format';
import {
  DEMO_COMPOUNDS,
  DEMO_TARGETS,
  REFERENCE_CONCENTRATION_UM,
  REFERENCE_IDENTIFIER,
  trueBlock,
  VEHICLE_IDENTIFIER,
  type DemoTarget,
} from './demo-compounds';
import type { PlannedFailure, PlatePlan } from './plate-plans';
import { clamp, makeRandom, roundTo, type Random } from './random';

/** One simulated well in canonical units (µM, pA, GΩ, MΩ, pF), values rounded as the export writes them. */
export interface DemoWell {
  position: string;
  rowIndex: number;
  columnIndex: number;
  role: 'vehicle' | 'reference' | 'test';
  compound: string;
  concentration_uM: number | null;
  target: DemoTarget;
  /** The block the generator applied (0 for vehicle wells), before run-down and noise. */
  trueBlock: number;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
  failure: PlannedFailure | null;
}

const PLATE_ROWS = { 96: 8, 384: 16 } as const;
const PLATE_COLUMNS = { 96: 12, 384: 24 } as const;

/** Lays out and records every used well of a plan, in row-major order; wells left empty are not exported. */
export function simulatePlate(plan: PlatePlan): DemoWell[] {
  const random = makeRandom(plan.seed);
  const wells = layOutWells(plan).map((well) => recordWell(plan, well, random));
  return wells.sort((a, b) => a.rowIndex - b.rowIndex || a.columnIndex - b.columnIndex);
}

type Placement = Pick<DemoWell, 'rowIndex' | 'columnIndex' | 'role' | 'compound' | 'concentration_uM'>;

function layOutWells(plan: PlatePlan): Placement[] {
  const rows = PLATE_ROWS[plan.format];
  const placements: Placement[] = [];
  const columnsOf = (
    list: number[],
    role: 'vehicle' | 'reference',
    compound: string,
    concentration_uM: number | null,
  ) => {
    for (const column of list)
      for (let row = 0; row < rows; row += 1)
        placements.push({ rowIndex: row, columnIndex: column - 1, role, compound, concentration_uM });
  };
  columnsOf(plan.vehicleColumns, 'vehicle', VEHICLE_IDENTIFIER, null);
  columnsOf(plan.referenceColumns, 'reference', REFERENCE_IDENTIFIER, REFERENCE_CONCENTRATION_UM);
  const controls = new Set([...plan.vehicleColumns, ...plan.referenceColumns]);
  const testColumns = Array.from({ length: PLATE_COLUMNS[plan.format] }, (_, i) => i + 1).filter(
    (column) => !controls.has(column),
  );
  plan.compounds.forEach((compound, k) => {
    for (let rep = 0; rep < plan.replicates; rep += 1) {
      plan.concentrations_uM.forEach((concentration_uM, j) => {
        const index = (k * plan.replicates + rep) * plan.concentrations_uM.length + j;
        const column = testColumns[Math.floor(index / rows)];
        if (column === undefined)
          throw new RangeError(`${plan.file}: the test wells do not fit on a ${plan.format}-well plate`);
        placements.push({
          rowIndex: index % rows,
          columnIndex: column - 1,
          role: 'test',
          compound,
          concentration_uM,
        });
      });
    }
  });
  return placements;
}

function recordWell(plan: PlatePlan, placement: Placement, random: Random): DemoWell {
  const position = wellLabel(placement.rowIndex, placement.columnIndex);
  const failure = plan.failures.find((f) => f.well === position) ?? null;
  const target = DEMO_TARGETS[plan.target];
  const { noise } = plan;
  const block =
    placement.role === 'test'
      ? trueBlock(placement.concentration_uM ?? 0, potencyOf(placement.compound, plan.target))
      : placement.role === 'reference'
        ? 1
        : 0;
  const rundown = random.normal(noise.rundownMean, noise.rundownSd);
  const ratio =
    placement.role === 'reference'
      ? random.normal(noise.referenceRatio, noise.referenceSd)
      : (1 - block) * rundown + random.normal(0, noise.ratioSd);
  const magnitude =
    failure?.kind === 'small_current'
      ? random.uniform(60, 150)
      : clamp(random.logNormal(target.controlMedian_pA, 0.35), 600, 9000);
  const control = target.sign * magnitude;
  const compound = control * ratio + random.normal(0, noise.currentNoise_pA);
  const seal =
    failure?.kind === 'low_seal' ? random.uniform(0.1, 0.35) : clamp(random.logNormal(1.6, 0.35), 0.7, 6);
  const series =
    failure?.kind === 'high_series_resistance'
      ? random.uniform(30, 45)
      : clamp(random.logNormal(6, 0.3), 2, 15);
  const capacitance = clamp(random.logNormal(18, 0.3), 6, 45);
  const well: DemoWell = {
    position,
    ...placement,
    target: plan.target,
    trueBlock: block,
    controlCurrent_pA: roundTo(control, 1),
    compoundCurrent_pA: roundTo(compound, 1),
    sealResistance_GOhm: roundTo(seal, 3),
    seriesResistance_MOhm: roundTo(series, 2),
    capacitance_pF: roundTo(capacitance, 2),
    failure,
  };
  if (failure?.missing) well[failure.missing] = null;
  return well;
}

function potencyOf(identifier: string, target: DemoTarget) {
  const compound = DEMO_COMPOUNDS.find((c) => c.identifier === identifier);
  if (!compound) throw new RangeError(`demo compound ${identifier} is not defined`);
  return compound.truth[target];
}
