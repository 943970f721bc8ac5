import 'server-only';
import type { WellRole } from '@/lib/domain/well-roles';
import { PLATE_FORMAT_SIZE, type PlateFormat } from '@/lib/domain/plate-formats';
import type { BlockReadout } from '@/lib/domain/fits';
import type { PreviewRow } from './read-row';

/** The currents of one target in one well, pA (sign as recorded: inward currents are negative). */
export interface ParsedReadout {
  target: string;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  /** The fractional block as the file gives it directly (null when missing); absent when computed from currents. */
  givenBlock?: number | null;
  /** The concentration of this application when the cell received several in turn (cumulative); else absent. */
  concentration_uM?: number;
  /** Which of the target's block readouts it is; absent: the tonic one (a target's only readout). */
  readout?: BlockReadout;
  /** The spreadsheet row it came from. */
  row: number;
}

/** One well: position (0-based indices), what it holds, and the recording's cell properties. */
export interface ParsedWell {
  position: string;
  rowIndex: number;
  columnIndex: number;
  role: WellRole;
  compound: string | null;
  concentration_uM: number | null;
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
  readouts: ParsedReadout[];
}

/** The plate as parsed: format, wells in row-major order and the targets in order of first appearance. */
export interface ParsedPlate {
  format: PlateFormat;
  formatSource: 'chosen' | 'inferred';
  rows: number;
  columns: number;
  targets: string[];
  wells: ParsedWell[];
}

/** Gathers the rows without errors into wells and readouts; cell properties come from a well's first row that has them. */
export function buildPlate(
  rows: readonly PreviewRow[],
  format: PlateFormat,
  formatSource: 'chosen' | 'inferred',
): ParsedPlate {
  const wells = new Map<string, ParsedWell>();
  const targets: string[] = [];
  const concentrationOfRow = new Map(rows.map((r) => [r.row, r.values.concentration_uM]));
  for (const { row, status, values } of rows) {
    if (status !== 'ok' || values.well === null || values.rowIndex === null || values.columnIndex === null)
      continue;
    if (values.role === null || values.target === null) continue;
    let well = wells.get(values.well);
    if (!well) {
      well = {
        position: values.well,
        rowIndex: values.rowIndex,
        columnIndex: values.columnIndex,
        role: values.role,
        compound: values.compound,
        concentration_uM: values.concentration_uM,
        sealResistance_GOhm: null,
        seriesResistance_MOhm: null,
        capacitance_pF: null,
        readouts: [],
      };
      wells.set(values.well, well);
    }
    well.sealResistance_GOhm ??= values.sealResistance_GOhm;
    well.seriesResistance_MOhm ??= values.seriesResistance_MOhm;
    well.capacitance_pF ??= values.capacitance_pF;
    well.readouts.push({
      target: values.target,
      controlCurrent_pA: values.controlCurrent_pA,
      compoundCurrent_pA: values.compoundCurrent_pA,
      ...(values.givenBlock !== undefined ? { givenBlock: values.givenBlock } : {}),
      row,
    });
    if (values.useDependent) {
      const ud = values.useDependent;
      well.readouts.push({
        target: values.target,
        controlCurrent_pA: ud.controlCurrent_pA,
        compoundCurrent_pA: ud.compoundCurrent_pA,
        ...(ud.givenBlock !== undefined ? { givenBlock: ud.givenBlock } : {}),
        readout: 'use_dependent',
        row,
      });
    }
    if (!targets.includes(values.target)) targets.push(values.target);
  }
  // A well with several rows of one target received several concentrations in turn (cumulative
  // application): each readout keeps its own, and the well shows the last, highest one.
  for (const well of wells.values()) {
    const perTarget = new Map<string, number>();
    for (const r of well.readouts) {
      const key = `${r.target}\u0000${r.readout ?? 'tonic'}`;
      perTarget.set(key, (perTarget.get(key) ?? 0) + 1);
    }
    if (![...perTarget.values()].some((n) => n > 1)) continue;
    for (const r of well.readouts) {
      const c = concentrationOfRow.get(r.row);
      if (c !== null && c !== undefined) r.concentration_uM = c;
    }
    const applied = well.readouts.flatMap((r) =>
      r.concentration_uM === undefined ? [] : [r.concentration_uM],
    );
    if (applied.length > 0) well.concentration_uM = Math.max(...applied);
  }
  const sorted = [...wells.values()].sort((a, b) => a.rowIndex - b.rowIndex || a.columnIndex - b.columnIndex);
  return { format, formatSource, ...PLATE_FORMAT_SIZE[format], targets, wells: sorted };
}
