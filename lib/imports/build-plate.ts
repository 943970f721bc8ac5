import 'server-only';
import type { WellRole } from '@/lib/domain/well-roles';
import { PLATE_FORMAT_SIZE, type PlateFormat } from '@/lib/domain/plate-formats';
import type { PreviewRow } from './read-row';

/** The currents of one target in one well, pA (sign as recorded: inward currents are negative). */
export interface ParsedReadout {
  target: string;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  /** The fractional block as the file gives it directly (null when missing); absent when computed from currents. */
  givenBlock?: number | null;
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
    if (!targets.includes(values.target)) targets.push(values.target);
  }
  const sorted = [...wells.values()].sort((a, b) => a.rowIndex - b.rowIndex || a.columnIndex - b.columnIndex);
  return { format, formatSource, ...PLATE_FORMAT_SIZE[format], targets, wells: sorted };
}
