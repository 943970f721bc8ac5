import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import type { BlockReadout } from '@/lib/domain/fits';
import { awaitingCondition } from '@/lib/signoff/awaiting';
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
  /** Plate facts the file gave outside its table (lib/imports/plate-facts.ts): barcode, runDate, cellLine, temperature, operator. */
  facts: Record<string, string>;
  qcSummary: {
    target: string;
    zPrime: { zPrime: number | null; band: string | null; passes: boolean; message: string };
    notes: { code: string; message: string }[];
    rundownCorrected: boolean;
    normalised: boolean;
    vehicleMeanRatio: number | null;
    /** Present only when a QC rule was not applied (lib/science/qc/qc-rules.ts). */
    qcRulesNotApplied?: { rule: string; label: string; message: string }[];
  }[];
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
  /** Which of the target's block readouts this is (tonic unless the screen names a use-dependent one). */
  readout: BlockReadout;
}

export interface FitRow {
  id: string;
  compoundId: string;
  compound: string;
  targetId: string;
  target: string;
  conductance: string;
  /** The readout fitted, and the name the screen gives it (null: the target reports one readout). */
  readout: BlockReadout;
  readoutName: string | null;
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

// SQL for speed: the plate with its screen, importer and file in one query, the time written as UTC text by PostgreSQL.
export async function selectPlateHeader(plateId: string): Promise<Omit<PlateHeader, 'targets'> | undefined> {
  const [plate] = await db().query<Omit<PlateHeader, 'targets'>>(
    `select p.id, p.label, p.format, p.state, p.version, p.fits_pending as "fitsPending", p.screen_id as "screenId", s.name as "screenName", s.neuron_preset as "neuronPreset",
            s.z_prime_min as "zPrimeMin", s.exposures_um as "exposures_uM", p.imported_by as "importedBy", u.name as "importedByName",
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt", f.filename, f.sha256, p.qc_summary as "qcSummary",
            p.facts
       from plates p join screens s on s.id = p.screen_id join users u on u.id = p.imported_by join uploaded_files f on f.id = p.uploaded_file_id
      where p.id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return plate;
}

// SQL for speed: up to 384 wells × targets as plain rows in one joined query (the grid reads every one).
export async function selectPlateWells(plateId: string): Promise<WellRow[]> {
  return db().query<WellRow>(
    `select w.id, r.id as "readoutId", w.position, w.row_index as "rowIndex", w.column_index as "columnIndex", w.role, w.compound_id as "compoundId",
            c.identifier as compound, w.concentration_um as "concentration_uM", w.seal_resistance_gohm as "sealResistance_GOhm",
            w.series_resistance_mohm as "seriesResistance_MOhm", w.capacitance_pf as "capacitance_pF", w.excluded, w.exclusion_reason as "exclusionReason",
            r.target_id as "targetId", t.name as target, r.control_current_pa as "controlCurrent_pA", r.compound_current_pa as "compoundCurrent_pA",
            r.fractional_block as "fractionalBlock", r.qc_reasons as "qcReasons", r.readout
       from wells w join readouts r on r.well_id = w.id join targets t on t.id = r.target_id left join compounds c on c.id = w.compound_id
      where w.plate_id = :plateId
      order by w.row_index, w.column_index, t.name, r.readout`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}

// SQL for speed: the plate's fits with compound and target as plain rows, ordered case-blind (upper()), which the ORM cannot say.
export async function selectPlateFits(plateId: string): Promise<FitRow[]> {
  return db().query<FitRow>(
    `select f.id, f.compound_id as "compoundId", c.identifier as compound, f.target_id as "targetId", t.name as target, t.conductance,
            f.readout, t.block_readouts ->> f.readout as "readoutName", f.model, f.status, f.message,
            f.ic50_um as "ic50_uM", f.ic50_ci_low_um as "ic50CiLow_uM", f.ic50_ci_high_um as "ic50CiHigh_uM", f.ic50_lower_bound_um as "ic50LowerBound_uM",
            f.log10_ic50_se as "log10Ic50Se", f.hill, f.top, f.bottom, f.r2, f.residual_sd as "residualSd", f.n, f.flags
       from fits f join compounds c on c.id = f.compound_id join targets t on t.id = f.target_id
      where f.plate_id = :plateId
      order by upper(c.identifier), t.name, f.readout`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}

export interface FitEstimateRow {
  id: string;
  estimate: { parameters?: number[]; covariance?: number[][] | null; degreesOfFreedom?: number } | null;
  lowest: number | null;
  highest: number | null;
}

// SQL: an aggregate with a filter over the plate's wells, joined to the fits; the ORM cannot say it.
export async function selectFitEstimatesWithRanges(plateId: string): Promise<FitEstimateRow[]> {
  return db().query<FitEstimateRow>(
    // Each compound's tested range, read once over the plate's wells (not once per fit and target).
    `with ranges as (
       select w.compound_id, min(w.concentration_um) filter (where w.concentration_um > 0) as lowest, max(w.concentration_um) as highest
         from wells w where w.plate_id = :plateId and w.compound_id is not null group by w.compound_id
     )
     select f.id, f.estimate, r.lowest, r.highest
       from fits f left join ranges r on r.compound_id = f.compound_id
      where f.plate_id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}

export interface PlateSummary {
  id: string;
  label: string;
  format: number;
  state: PlateState;
  screenName: string;
  importedBy: string;
  importedAt: string;
  wellCount: number;
  failingWellCount: number;
  /** Targets whose Z′ fails the screen's limit. */
  failingTargets: number;
}

export interface PlateFilter {
  state?: PlateState[];
  screenId?: string;
  /** Plates waiting for this user's action (the "My work" list). */
  waitingFor?: Actor;
  importedBy?: string;
  /** Imported on or after this day (UTC, YYYY-MM-DD). */
  from?: string;
  /** Imported on or before this day (UTC, YYYY-MM-DD). */
  to?: string;
}

/** The filter as SQL conditions on `plates p`, or null when nothing can match. */
function filterSql(filter: PlateFilter): { where: string; replacements: Record<string, unknown> } | null {
  const where: string[] = [];
  const replacements: Record<string, unknown> = {};
  const add = (condition: string, values: Record<string, unknown>) => {
    where.push(condition);
    Object.assign(replacements, values);
  };
  if (filter.state?.length) add('p.state in (:states)', { states: filter.state });
  if (filter.waitingFor) {
    const awaiting = awaitingCondition(filter.waitingFor);
    if (!awaiting) return null;
    add(awaiting.sql, awaiting.replacements);
  }
  if (filter.screenId) add('p.screen_id = :screenId', { screenId: filter.screenId });
  if (filter.importedBy) add('p.imported_by = :importedBy', { importedBy: filter.importedBy });
  if (filter.from) add("p.imported_at >= (cast(:from as date) at time zone 'UTC')", { from: filter.from });
  if (filter.to) add("p.imported_at < ((cast(:to as date) + 1) at time zone 'UTC')", { to: filter.to });
  return { where: where.length ? `where ${where.join(' and ')}` : '', replacements };
}

/**
 * SQL for speed (README, Load): plates, newest first, with well counts and the number of wells that fail QC
 * on any target (a well fails when one of its readouts has QC reasons). Both counts are read from
 * plate_well_tallies, which triggers keep true with every change to the plate's wells and readouts
 * (migrations/20261211001100-plate-well-tallies-and-filter-indexes.js): counting them per page read
 * 19,200 wells and took 870 ms on a year of data (docs/performance.md, "A year of data").
 */
export async function selectPlates(
  filter: PlateFilter,
  limit: number,
  offset: number,
): Promise<PlateSummary[]> {
  const sql = filterSql(filter);
  if (!sql) return [];
  return db().query<PlateSummary>(
    `with page as materialized (
       select p.id from plates p ${sql.where} order by p.imported_at desc, p.id desc limit :limit offset :offset
     )
     select p.id, p.label, p.format, p.state, s.name as "screenName", u.name as "importedBy",
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt",
            coalesce(t.wells, 0) as "wellCount", coalesce(t.failing_wells, 0) as "failingWellCount",
            (select count(*)::int from jsonb_array_elements(p.qc_summary) q where (q -> 'zPrime' ->> 'passes')::boolean is not true) as "failingTargets"
       from page
       join plates p on p.id = page.id
       join screens s on s.id = p.screen_id
       join users u on u.id = p.imported_by
       left join plate_well_tallies t on t.plate_id = p.id
      order by p.imported_at desc, p.id desc`,
    { type: QueryTypes.SELECT, replacements: { ...sql.replacements, limit, offset } },
  );
}

// SQL: counts the plates matching the same filter conditions as the page.
export async function countPlates(filter: PlateFilter): Promise<number> {
  const sql = filterSql(filter);
  if (!sql) return 0;
  const [counted] = await db().query<{ total: number }>(
    `select count(*)::int as total from plates p ${sql.where}`,
    { type: QueryTypes.SELECT, replacements: sql.replacements },
  );
  return counted?.total ?? 0;
}

// SQL: importers through a relation the models do not declare from the user's side. One probe of the
// plates_imported_by index per user (exists), not a join over every plate: 2 ms a list page on a year of data.
export async function selectImporters(): Promise<{ id: string; name: string }[]> {
  return db().query<{ id: string; name: string }>(
    'select u.id, u.name from users u where exists (select 1 from plates p where p.imported_by = u.id) order by u.name',
    { type: QueryTypes.SELECT },
  );
}

// SQL for speed: the duplicate check of every upload, one indexed join with a limit. A file of several
// plates is named by the plate whose label sorts first (byte order), so the answer is the same every time.
export async function selectDuplicateUpload(
  screenId: string,
  sha256: string,
  transaction?: Transaction,
): Promise<{ plateId: string; label: string } | undefined> {
  const [row] = await db().query<{ plateId: string; label: string }>(
    `select p.id as "plateId", p.label from uploaded_files f join plates p on p.uploaded_file_id = f.id
      where f.screen_id = :screenId and f.sha256 = :sha256 order by p.label collate "C", p.id limit 1`,
    { type: QueryTypes.SELECT, replacements: { screenId, sha256 }, ...(transaction ? { transaction } : {}) },
  );
  return row;
}

const WELL_COLUMNS = {
  id: 'uuid',
  plate_id: 'uuid',
  position: 'text',
  row_index: 'smallint',
  column_index: 'smallint',
  role: 'text',
  compound_id: 'uuid',
  concentration_um: 'double precision',
  seal_resistance_gohm: 'double precision',
  series_resistance_mohm: 'double precision',
  capacitance_pf: 'double precision',
} as const;
const READOUT_COLUMNS = {
  id: 'uuid',
  well_id: 'uuid',
  target_id: 'uuid',
  control_current_pa: 'double precision',
  compound_current_pa: 'double precision',
  block_given: 'boolean',
  given_block: 'double precision',
  concentration_um: 'double precision',
  fractional_block: 'double precision',
  qc_reasons: 'jsonb',
  readout: 'text',
} as const;

/** Inserts rows (plain objects keyed by column) with one statement and one JSON parameter. */
async function insertRows(
  table: string,
  columns: Record<string, string>,
  rows: Record<string, unknown>[],
  transaction: Transaction,
): Promise<void> {
  if (rows.length === 0) return;
  const names = Object.keys(columns);
  await db().query(
    `insert into ${table} (${names.join(', ')}) select ${names.join(', ')} from jsonb_to_recordset($1::jsonb) as r(${names.map((n) => `${n} ${columns[n]}`).join(', ')})`,
    { bind: [JSON.stringify(rows)], transaction },
  );
}

// SQL for speed: a plate's hundreds of wells in one statement (model instances took most of an import's time).
export async function insertWells(rows: Record<string, unknown>[], transaction: Transaction): Promise<void> {
  await insertRows('wells', WELL_COLUMNS, rows, transaction);
}

// SQL for speed: a plate's readouts in one statement (model instances took most of an import's time).
export async function insertReadouts(
  rows: Record<string, unknown>[],
  transaction: Transaction,
): Promise<void> {
  await insertRows('readouts', READOUT_COLUMNS, rows, transaction);
}

export interface PlateAnswerStamp {
  version: number;
  state: string;
  fitsPending: boolean;
  revision: string | null;
  targetsChangedAt: string | null;
}

// SQL: one indexed read of what a plate's JSON answers depend on (its content revision, workflow columns
// and the last change to its screen's targets), for their entity tag.
export async function selectPlateAnswerStamp(plateId: string): Promise<PlateAnswerStamp | null> {
  const [row] = await db().query<PlateAnswerStamp>(
    `select p.version, p.state, p.fits_pending as "fitsPending", r.revision::text as revision,
            (select max(t.updated_at) from targets t where t.screen_id = p.screen_id)::text as "targetsChangedAt"
       from plates p left join plate_content_revisions r on r.plate_id = p.id
      where p.id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return row ?? null;
}
