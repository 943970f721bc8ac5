import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import type { BlockReadout } from '@/lib/domain/fits';
import type { ForecastResult } from '@/lib/science/forecast/assemble';

// SQL: one null-safe match on the plate (`is not distinct from`, a profile forecast has none), oldest first.
export async function selectStoredForecast(
  owner: { compoundId: string; plateId: string | null },
  inputSha256: string,
  transaction?: Transaction,
): Promise<{ result: ForecastResult; computedAt: Date } | undefined> {
  const [row] = await db().query<{ result: ForecastResult; computedAt: Date }>(
    `select result, computed_at as "computedAt" from forecasts
      where compound_id = :compoundId and input_sha256 = :inputSha256 and plate_id is not distinct from :plateId
      order by computed_at limit 1`,
    {
      type: QueryTypes.SELECT,
      replacements: { compoundId: owner.compoundId, plateId: owner.plateId, inputSha256 },
      transaction,
    },
  );
  return row;
}

// SQL for speed: only the distinct keys, not the stored results (large JSON) the model would read.
export async function selectStoredKeys(plateId: string, inputSha256s: string[]): Promise<{ sha: string }[]> {
  return db().query<{ sha: string }>(
    'select distinct input_sha256 as sha from forecasts where plate_id = :plateId and input_sha256 in (:inputSha256s)',
    { type: QueryTypes.SELECT, replacements: { plateId, inputSha256s } },
  );
}

// SQL for a lock: a transaction-level advisory lock on the input's key, so that two computations store one row.
export async function lockForecastInput(inputSha256: string, transaction: Transaction): Promise<void> {
  await db().query('select pg_advisory_xact_lock(hashtextextended(:key, 0))', {
    replacements: { key: `forecast:${inputSha256}` },
    transaction,
  });
}

export interface FitUncertaintyRow {
  id: string;
  plateId: string;
  compoundId: string;
  targetId: string;
  /** The readout the fit is of: its wells are that readout's. */
  readout: BlockReadout;
  model: 'hill2' | 'hill4';
  estimate: { covariance?: number[][] | null; degreesOfFreedom?: number } | null;
}

// SQL for speed: only the estimates of the fits named, not the rest of their rows.
export async function selectFitUncertainties(fitIds: string[]): Promise<FitUncertaintyRow[]> {
  if (fitIds.length === 0) return [];
  return db().query<FitUncertaintyRow>(
    `select id, plate_id as "plateId", compound_id as "compoundId", target_id as "targetId", readout, model, estimate
       from fits where id in (:fitIds)`,
    { type: QueryTypes.SELECT, replacements: { fitIds } },
  );
}

// SQL: the wells a fit could use (test wells of its compound on its plate, target and readout, not excluded,
// with a block and no QC reason), for a bootstrap when its covariance is unusable.
export async function selectFitWells(
  fit: Pick<FitUncertaintyRow, 'plateId' | 'compoundId' | 'targetId' | 'readout'>,
): Promise<{ concentration_uM: number; block: number }[]> {
  return db().query<{ concentration_uM: number; block: number }>(
    `select w.concentration_um as "concentration_uM", r.fractional_block as block
       from wells w join readouts r on r.well_id = w.id
      where w.plate_id = :plateId and w.compound_id = :compoundId and r.target_id = :targetId
        and r.readout = :readout and not w.excluded and w.concentration_um is not null and r.fractional_block is not null
        and jsonb_array_length(r.qc_reasons) = 0
      order by w.row_index, w.column_index`,
    {
      type: QueryTypes.SELECT,
      replacements: {
        plateId: fit.plateId,
        compoundId: fit.compoundId,
        targetId: fit.targetId,
        readout: fit.readout,
      },
    },
  );
}
