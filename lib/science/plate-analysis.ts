// A whole plate through the science: well QC per readout, fractional block and Z′ per target, Hill fits
// per compound × target. Pure and deterministic; the import and every exclusion change call it.
import type { CurrentReadouts, WellQuantities } from './qc/quantities';
import { computeFractionalBlock, type BlockNoteCode } from './fit/block';
import { PRIMARY_READOUT, type BlockReadout } from './fit/block-readouts';
import { fitHill, type HillFitResult } from './fit/hill-fit';
import type { HillModelName } from './fit/hill-model';
import { checkWells, type QcReason } from './qc/qc';
import { qcRulesNotApplied, readoutsAbsentFromEveryWell, type QcRuleNotApplied } from './qc/qc-rules';
import { resolveQcThresholds, type QcThresholds } from './qc/qc-thresholds';
import type { WellRole } from './qc/well';
import type { ZPrimeResult } from './qc/zprime';

export interface AnalysisWell extends WellQuantities {
  id: string;
  role: WellRole;
  compoundId: string | null;
  /** Excluded by a person (with a reason); never deleted. */
  excluded: boolean;
}

export interface AnalysisReadout extends CurrentReadouts {
  id: string;
  wellId: string;
  /** Target identity (id or name), the same for every readout of one target. */
  target: string;
  /**
   * The fractional block as the file gives it directly (null when missing), instead of the current after
   * compound; absent for readouts whose block is computed from the currents.
   */
  givenBlock?: number | null;
  /** The concentration of this application when the cell received several in turn; absent: the well's. */
  concentration_uM?: number | null;
  /** Which of the target's block readouts this is; absent: the tonic one (a target's only readout). */
  readout?: BlockReadout;
}

export interface AnalysisSettings {
  thresholds?: Partial<QcThresholds>;
  normalise?: boolean;
  /** @default 0.5 (Zhang, Chung & Oldenburg 1999: Z′ ≥ 0.5 excellent) */
  zPrimeMin?: number;
  /** Model per `compoundId|target`; others use hill2. */
  models?: Record<string, HillModelName>;
}

export interface ReadoutAnalysis {
  id: string;
  qcReasons: QcReason[];
  /** Used in control means and fits: QC passed and not excluded. */
  used: boolean;
  block: number | null;
}

export interface TargetAnalysis {
  target: string;
  zPrime: ZPrimeResult;
  rundownCorrected: boolean;
  normalised: boolean;
  vehicleMeanRatio: number | null;
  notes: { code: BlockNoteCode; message: string }[];
  /** The plate's QC rules not applied (as PlateAnalysis); absent when every rule was applied. */
  qcRulesNotApplied?: QcRuleNotApplied[];
}

export interface FitAnalysis {
  compoundId: string;
  target: string;
  /** The readout fitted: each of a target's readouts is fitted on its own. */
  readout: BlockReadout;
  model: HillModelName;
  result: HillFitResult;
}

export interface PlateAnalysis {
  /** Rules whose readout no well of the plate carries: not applied to any well (empty when all apply). */
  qcRulesNotApplied: QcRuleNotApplied[];
  readouts: ReadoutAnalysis[];
  targets: TargetAnalysis[];
  fits: FitAnalysis[];
}

export const fitKey = (compoundId: string, target: string): string => `${compoundId}|${target}`;

/**
 * The group a readout's block is computed in: its target for the tonic readout, else the target and the
 * readout, so that each readout has its own controls (the vehicle and reference wells read at that moment).
 */
const blockGroup = (r: AnalysisReadout): string =>
  (r.readout ?? PRIMARY_READOUT) === PRIMARY_READOUT ? r.target : `${r.target}\u0000${r.readout}`;

/**
 * Analyses one plate; readouts of unknown wells are a programming error and throw. With
 * `{ fits: false }` it stops after QC, block and Z′ (the fits then come from a job, lib/jobs).
 */
export function analysePlate(
  wells: readonly AnalysisWell[],
  readouts: readonly AnalysisReadout[],
  settings: AnalysisSettings = {},
  options: { fits?: boolean } = {},
): PlateAnalysis {
  const wellById = new Map(wells.map((w) => [w.id, w]));
  const wellOf = (r: AnalysisReadout): AnalysisWell => {
    const well = wellById.get(r.wellId);
    if (!well) throw new Error(`readout ${r.id} refers to unknown well ${r.wellId}`);
    return well;
  };

  // A recording property that no well of the whole plate carries was not in the file: its rule is not
  // applied (and said so) rather than failing every well. Judged from the wells, so the stored plate gives
  // the same answer at every recompute as the file gave at import.
  // A plate whose file gives the block directly may carry no control current at all: the control-current
  // rule is then not applied either.
  const absentReadouts = [
    ...readoutsAbsentFromEveryWell(wells),
    ...(readouts.length > 0 &&
    readouts.every((r) => r.givenBlock !== undefined && r.controlCurrent_pA === null)
      ? (['controlCurrent_pA'] as const)
      : []),
  ];
  const notApplied = qcRulesNotApplied(absentReadouts, resolveQcThresholds(settings.thresholds));
  const qc = checkWells(
    readouts.map((r) => {
      const w = wellOf(r);
      return {
        wellId: r.id,
        role: w.role,
        controlCurrent_pA: r.controlCurrent_pA,
        compoundCurrent_pA: r.compoundCurrent_pA,
        ...(r.givenBlock !== undefined ? { givenBlock: r.givenBlock } : {}),
        sealResistance_GOhm: w.sealResistance_GOhm,
        seriesResistance_MOhm: w.seriesResistance_MOhm,
        capacitance_pF: w.capacitance_pF,
      };
    }),
    settings.thresholds,
    { absentReadouts },
  );
  const used = readouts.map((r, i) => qc[i]!.passed && !wellOf(r).excluded);

  const blocks = computeFractionalBlock(
    readouts.map((r, i) => ({
      wellId: r.id,
      target: blockGroup(r),
      role: wellOf(r).role,
      controlCurrent_pA: r.controlCurrent_pA,
      compoundCurrent_pA: r.compoundCurrent_pA,
      ...(r.givenBlock !== undefined ? { givenBlock: r.givenBlock } : {}),
      excluded: !used[i],
    })),
    { normalise: settings.normalise ?? false, zPrimeMin: settings.zPrimeMin ?? 0.5 },
  );
  const blockById = new Map(blocks.flatMap((t) => t.wells.map((w) => [w.wellId, w.block] as const)));

  const groups = new Map<
    string,
    {
      compoundId: string;
      target: string;
      readout: BlockReadout;
      c: number[];
      b: number[];
      x: boolean[];
      cell: string[];
    }
  >();
  readouts.forEach((r, i) => {
    const w = wellOf(r);
    const concentration_uM = r.concentration_uM ?? w.concentration_uM;
    if (w.role !== 'test' || !w.compoundId || concentration_uM === null) return;
    const readout = r.readout ?? PRIMARY_READOUT;
    const key = JSON.stringify([w.compoundId, r.target, readout]);
    const group = groups.get(key) ?? {
      compoundId: w.compoundId,
      target: r.target,
      readout,
      c: [],
      b: [],
      x: [],
      cell: [],
    };
    const block = blockById.get(r.id) ?? null;
    group.c.push(concentration_uM);
    group.b.push(block ?? Number.NaN);
    group.x.push(!used[i] || block === null);
    // The well is the cell: readouts of one well and target are its applications in turn (cumulative),
    // and the fit's CI then takes the cell as the unit (lib/science/fit/cell-clusters.ts).
    group.cell.push(w.id);
    groups.set(key, group);
  });

  return {
    qcRulesNotApplied: notApplied,
    readouts: readouts.map((r, i) => ({
      id: r.id,
      qcReasons: qc[i]!.reasons,
      used: used[i]!,
      block: blockById.get(r.id) ?? null,
    })),
    // Z′ and the block notes of a target are its tonic readout's; the use-dependent readout's controls
    // set only its own block.
    targets: blocks
      .filter((t) => !t.target.includes('\u0000'))
      .map((t) => ({
        target: t.target,
        zPrime: t.zPrime,
        rundownCorrected: t.rundownCorrected,
        normalised: t.normalised,
        vehicleMeanRatio: t.vehicleMeanRatio,
        notes: t.notes,
        // Kept with each target's QC summary only when a rule was not applied, so a plate whose file
        // carries every readout stores the same summary as before.
        ...(notApplied.length > 0 ? { qcRulesNotApplied: notApplied } : {}),
      })),
    fits:
      options.fits === false
        ? []
        : [...groups.values()].map((g) => {
            // One model per compound × target, for each of its readouts.
            const model = settings.models?.[fitKey(g.compoundId, g.target)] ?? 'hill2';
            return {
              compoundId: g.compoundId,
              target: g.target,
              readout: g.readout,
              model,
              result: fitHill({ concentration_uM: g.c, block: g.b, excluded: g.x, cell: g.cell }, { model }),
            };
          }),
  };
}
