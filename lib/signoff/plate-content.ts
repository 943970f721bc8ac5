import 'server-only';
import { QueryTypes, Transaction } from 'sequelize';
import { contentSha256 } from '@/lib/auth/canonical-json';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { processMap } from '@/lib/process-memory';

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

/**
 * SHA-256 of the canonical JSON of the plate's data as it stands. Inside the caller's transaction (a
 * signature) it is always worked out afresh; otherwise (the history tab) from the row-version cache below.
 */
export async function plateContentSha256(plateId: string, transaction?: Transaction): Promise<string> {
  if (transaction) return contentSha256(await plateContent(plateId, transaction));
  const fingerprint = await rowVersionFingerprint(plateId);
  const cached = contentHashes().get(plateId);
  if (cached && cached.fingerprint === fingerprint && Date.now() - cached.at < CONTENT_HASH_MAX_AGE_MS) return cached.sha256;
  // Read the content and the fingerprint in one snapshot, so that the cached hash belongs to that fingerprint.
  const { sha256, fingerprint: seen } = await db().transaction({ isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true }, async (snapshot) => ({
    sha256: contentSha256(await plateContent(plateId, snapshot)),
    fingerprint: await rowVersionFingerprint(plateId, snapshot),
  }));
  remember(plateId, { fingerprint: seen, sha256, at: Date.now() });
  return sha256;
}

/** A cached hash is worked out afresh at least this often, whatever the fingerprint says (common practice, no source). */
export const CONTENT_HASH_MAX_AGE_MS = 10 * 60 * 1000;
const CONTENT_HASH_ENTRIES = 1000;

interface CachedHash {
  fingerprint: string;
  sha256: string;
  at: number;
}

// One cache per server process, shared by the bundles that import this module.
const contentHashes = () => processMap<string, CachedHash>('plateContentHashes');

function remember(plateId: string, entry: CachedHash): void {
  const cache = contentHashes();
  cache.delete(plateId);
  cache.set(plateId, entry);
  if (cache.size > CONTENT_HASH_ENTRIES) cache.delete(cache.keys().next().value!);
}

/**
 * MD5 of the row versions (xmin, the writing transaction, and ctid, the tuple's place) of every row the
 * content reads. PostgreSQL writes a new tuple version for every UPDATE and removes it on DELETE, so
 * any change to those rows, through Gatewell or behind its back, gives another fingerprint; VACUUM FREEZE
 * may change it too, which only costs a fresh hash (PostgreSQL 15 manual, 5.5 "System Columns" and 25.1.5
 * "Preventing Transaction ID Wraparound Failures"). A few milliseconds in PostgreSQL instead of reading
 * and hashing every well, readout and fit.
 */
async function rowVersionFingerprint(plateId: string, transaction?: Transaction): Promise<string> {
  const [row] = await db().query<{ fingerprint: string | null }>(
    `select md5(string_agg(part, ',')) as fingerprint from (
       select 'p' || p.xmin || p.ctid || f.xmin || f.ctid as part from plates p join uploaded_files f on f.id = p.uploaded_file_id where p.id = :plateId
       union all (select 'w' || w.xmin || w.ctid || coalesce(c.xmin::text || c.ctid::text, '') from wells w left join compounds c on c.id = w.compound_id
                   where w.plate_id = :plateId order by w.id)
       union all (select 'r' || r.xmin || r.ctid from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by r.id)
       union all (select 'f' || x.xmin || x.ctid from fits x where x.plate_id = :plateId order by x.id)
     ) parts`,
    opts(plateId, transaction),
  );
  return row?.fingerprint ?? '';
}
