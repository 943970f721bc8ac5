import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { contentSha256 } from '@/lib/auth/canonical-json';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';

/** Format of the signed plate content; bump it if the fields below ever change. */
export const PLATE_CONTENT_FORMAT = 'gatewell-plate-content/1';

const opts = (plateId: string, transaction?: Transaction) => ({ type: QueryTypes.SELECT, replacements: { plateId }, ...(transaction ? { transaction } : {}) }) as const;

/**
 * The plate's data as a signature covers it: the plate's identity and source file, its QC summary,
 * every well with its exclusion, every readout, and every fit. Workflow fields (state, version, who
 * signed) are left out: they change with each signature, the data only when someone edits it.
 * Rows are ordered so that the same data always gives the same canonical JSON.
 */
export async function plateContent(plateId: string, transaction?: Transaction): Promise<Record<string, unknown>> {
  const sequelize = db();
  const [plate] = await sequelize.query<Record<string, unknown>>(
    `select p.id, p.label, p.format, p.screen_id as "screenId", p.supersedes_plate_id as "supersedesPlateId", p.imported_by as "importedBy",
            f.filename, f.sha256 as "fileSha256", p.qc_summary as "qcSummary"
       from plates p join uploaded_files f on f.id = p.uploaded_file_id where p.id = :plateId`,
    opts(plateId, transaction),
  );
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const wells = await sequelize.query(
    `select w.id, w.position, w.role, w.compound_id as "compoundId", c.identifier as compound, w.batch_id as "batchId",
            w.concentration_um as "concentrationUm", w.seal_resistance_gohm as "sealResistanceGohm", w.series_resistance_mohm as "seriesResistanceMohm",
            w.capacitance_pf as "capacitancePf", w.excluded, w.exclusion_reason as "exclusionReason", w.excluded_by as "excludedBy"
       from wells w left join compounds c on c.id = w.compound_id where w.plate_id = :plateId order by w.row_index, w.column_index`,
    opts(plateId, transaction),
  );
  const readouts = await sequelize.query(
    `select r.well_id as "wellId", r.target_id as "targetId", r.control_current_pa as "controlCurrentPa", r.compound_current_pa as "compoundCurrentPa",
            r.fractional_block as "fractionalBlock", r.qc_reasons as "qcReasons"
       from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by w.row_index, w.column_index, r.target_id`,
    opts(plateId, transaction),
  );
  const fits = await sequelize.query(
    `select compound_id as "compoundId", target_id as "targetId", model, status, message, ic50_um as "ic50Um", ic50_ci_low_um as "ic50CiLowUm",
            ic50_ci_high_um as "ic50CiHighUm", ic50_lower_bound_um as "ic50LowerBoundUm", log10_ic50_se as "log10Ic50Se", hill, top, bottom,
            r2, residual_sd as "residualSd", n, flags, estimate
       from fits where plate_id = :plateId order by compound_id, target_id`,
    opts(plateId, transaction),
  );
  return { format: PLATE_CONTENT_FORMAT, plate, wells, readouts, fits };
}

/** SHA-256 of the canonical JSON of the plate's data as it stands (inside the caller's transaction if given). */
export async function plateContentSha256(plateId: string, transaction?: Transaction): Promise<string> {
  return contentSha256(await plateContent(plateId, transaction));
}
