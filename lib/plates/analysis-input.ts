import 'server-only';
import { PRIMARY_READOUT, type BlockReadout } from '@/lib/domain/fits';
import type { ParsedPlate } from '@/lib/imports/build-plate';
import type { AnalysisReadout, AnalysisWell } from '@/lib/science/plate-analysis';

/** What the analysis reads of a well, named as the wells table names it (a `Well`, or a row about to be stored). */
export interface WellData {
  id: string;
  role: AnalysisWell['role'];
  compoundId: string | null;
  concentration_uM: number | null;
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
  /** @default false (a well not stored yet has not been excluded by anyone) */
  excluded?: boolean;
}

/** What the analysis reads of a readout, named as the readouts table names it (a `Readout`, or a row about to be stored). */
export interface ReadoutData {
  id: string;
  wellId: string;
  targetId: string;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  /** Whether the file gave the block directly (then `givenBlock` holds it); @default false */
  blockGiven?: boolean;
  givenBlock?: number | null;
  /** The concentration of this application (cumulative application); null or absent: the well's. */
  concentration_uM?: number | null;
  /** Which of the target's block readouts this is; @default 'tonic' */
  readout?: BlockReadout;
}

/** The wells and readouts `analysePlate` takes (lib/science/plate-analysis.ts). */
export interface AnalysisInput {
  wells: AnalysisWell[];
  readouts: AnalysisReadout[];
}

/**
 * Stored plate data as the analysis input: the one place where the columns of wells and readouts
 * become the science's names and units. Order is kept, so the analysis's readouts line up with `readouts`.
 */
export function analysisInput(wells: readonly WellData[], readouts: readonly ReadoutData[]): AnalysisInput {
  return {
    wells: wells.map((w) => ({
      id: w.id,
      role: w.role,
      compoundId: w.compoundId,
      concentration_uM: w.concentration_uM,
      sealResistance_GOhm: w.sealResistance_GOhm,
      seriesResistance_MOhm: w.seriesResistance_MOhm,
      capacitance_pF: w.capacitance_pF,
      excluded: w.excluded ?? false,
    })),
    readouts: readouts.map((r) => ({
      id: r.id,
      wellId: r.wellId,
      target: r.targetId,
      controlCurrent_pA: r.controlCurrent_pA,
      compoundCurrent_pA: r.compoundCurrent_pA,
      ...(r.blockGiven ? { givenBlock: r.givenBlock ?? null } : {}),
      ...(r.concentration_uM !== null && r.concentration_uM !== undefined
        ? { concentration_uM: r.concentration_uM }
        : {}),
      ...(r.readout !== undefined && r.readout !== PRIMARY_READOUT ? { readout: r.readout } : {}),
    })),
  };
}

/**
 * A parsed export before anything is stored (previews, benchmarks): each well is named by its place
 * in the plate's list, each readout by its spreadsheet row (a use-dependent one `row:use_dependent`), compounds and targets by the names in the file.
 */
export function parsedPlateInput(plate: ParsedPlate): AnalysisInput {
  return analysisInput(
    plate.wells.map((w, i) => ({
      id: String(i),
      role: w.role,
      compoundId: w.compound,
      concentration_uM: w.concentration_uM,
      sealResistance_GOhm: w.sealResistance_GOhm,
      seriesResistance_MOhm: w.seriesResistance_MOhm,
      capacitance_pF: w.capacitance_pF,
    })),
    plate.wells.flatMap((w, i) =>
      w.readouts.map((r) => ({
        // A row's use-dependent readout is named by the row too, told apart by a suffix.
        id: r.readout === 'use_dependent' ? `${r.row}:use_dependent` : String(r.row),
        wellId: String(i),
        targetId: r.target,
        controlCurrent_pA: r.controlCurrent_pA,
        compoundCurrent_pA: r.compoundCurrent_pA,
        ...(r.givenBlock !== undefined ? { blockGiven: true, givenBlock: r.givenBlock } : {}),
        ...(r.concentration_uM !== undefined ? { concentration_uM: r.concentration_uM } : {}),
        ...(r.readout !== undefined ? { readout: r.readout } : {}),
      })),
    ),
  );
}
