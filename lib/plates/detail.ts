import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import type { PlateState } from '@/lib/domain/plate-states';

export interface PlateHeader {
  id: string;
  label: string;
  format: number;
  state: PlateState;
  version: number;
  /** True while the fits wait for the refit queued by an import or a change (lib/jobs). */
  fitsPending: boolean;
  screenId: string;
  screenName: string;
  neuronPreset: string;
  zPrimeMin: number;
  exposures_uM: number[];
  importedBy: string;
  importedByName: string;
  importedAt: string;
  filename: string;
  sha256: string;
  qcSummary: { target: string; zPrime: { zPrime: number | null; band: string | null; passes: boolean; message: string }; notes: { code: string; message: string }[]; rundownCorrected: boolean; normalised: boolean; vehicleMeanRatio: number | null }[];
  targets: { id: string; name: string; conductance: string }[];
}

export interface WellRow {
  id: string;
  readoutId: string;
  position: string;
  rowIndex: number;
  columnIndex: number;
  role: 'vehicle' | 'reference' | 'test';
  compoundId: string | null;
  compound: string | null;
  concentration_uM: number | null;
  sealResistance_GOhm: number | null;
  seriesResistance_MOhm: number | null;
  capacitance_pF: number | null;
  excluded: boolean;
  exclusionReason: string | null;
  targetId: string;
  target: string;
  controlCurrent_pA: number | null;
  compoundCurrent_pA: number | null;
  fractionalBlock: number | null;
  qcReasons: { code: string; message: string }[];
}

export interface FitRow {
  id: string;
  compoundId: string;
  compound: string;
  targetId: string;
  target: string;
  conductance: string;
  model: 'hill2' | 'hill4';
  status: string;
  message: string;
  ic50_uM: number | null;
  ic50CiLow_uM: number | null;
  ic50CiHigh_uM: number | null;
  ic50LowerBound_uM: number | null;
  log10Ic50Se: number | null;
  hill: number | null;
  top: number | null;
  bottom: number | null;
  r2: number | null;
  residualSd: number | null;
  n: number;
  flags: { code: string; message: string }[];
}

/** A plate's header: screen, state, file and the QC summary per target. */
export async function getPlateHeader(actor: Actor, plateId: string): Promise<PlateHeader> {
  void actor; // every signed-in role may read plates
  const [plate] = await db().query<Omit<PlateHeader, 'targets'>>(
    `select p.id, p.label, p.format, p.state, p.version, p.fits_pending as "fitsPending", p.screen_id as "screenId", s.name as "screenName", s.neuron_preset as "neuronPreset",
            s.z_prime_min as "zPrimeMin", s.exposures_um as "exposures_uM", p.imported_by as "importedBy", u.name as "importedByName",
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt", f.filename, f.sha256, p.qc_summary as "qcSummary"
       from plates p join screens s on s.id = p.screen_id join users u on u.id = p.imported_by join uploaded_files f on f.id = p.uploaded_file_id
      where p.id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const targets = await db().query<PlateHeader['targets'][number]>(
    'select id, name, conductance from targets where screen_id = :screenId order by name', { type: QueryTypes.SELECT, replacements: { screenId: plate.screenId } },
  );
  return { ...plate, targets };
}

/** Every readout of the plate with its well, in plate order. */
export async function listPlateWells(actor: Actor, plateId: string): Promise<WellRow[]> {
  void actor;
  return db().query<WellRow>(
    `select w.id, r.id as "readoutId", w.position, w.row_index as "rowIndex", w.column_index as "columnIndex", w.role, w.compound_id as "compoundId",
            c.identifier as compound, w.concentration_um as "concentration_uM", w.seal_resistance_gohm as "sealResistance_GOhm",
            w.series_resistance_mohm as "seriesResistance_MOhm", w.capacitance_pf as "capacitance_pF", w.excluded, w.exclusion_reason as "exclusionReason",
            r.target_id as "targetId", t.name as target, r.control_current_pa as "controlCurrent_pA", r.compound_current_pa as "compoundCurrent_pA",
            r.fractional_block as "fractionalBlock", r.qc_reasons as "qcReasons"
       from wells w join readouts r on r.well_id = w.id join targets t on t.id = r.target_id left join compounds c on c.id = w.compound_id
      where w.plate_id = :plateId
      order by w.row_index, w.column_index, t.name`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}

/** The plate's Hill fits, by compound and target. */
export async function listPlateFits(actor: Actor, plateId: string): Promise<FitRow[]> {
  void actor;
  return db().query<FitRow>(
    `select f.id, f.compound_id as "compoundId", c.identifier as compound, f.target_id as "targetId", t.name as target, t.conductance, f.model, f.status, f.message,
            f.ic50_um as "ic50_uM", f.ic50_ci_low_um as "ic50CiLow_uM", f.ic50_ci_high_um as "ic50CiHigh_uM", f.ic50_lower_bound_um as "ic50LowerBound_uM",
            f.log10_ic50_se as "log10Ic50Se", f.hill, f.top, f.bottom, f.r2, f.residual_sd as "residualSd", f.n, f.flags
       from fits f join compounds c on c.id = f.compound_id join targets t on t.id = f.target_id
      where f.plate_id = :plateId
      order by upper(c.identifier), t.name`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}
