import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import type { PlateState } from '@/lib/domain/plate-states';

const opts = (plateId: string, transaction?: Transaction) =>
  ({ type: QueryTypes.SELECT, replacements: { plateId }, ...(transaction ? { transaction } : {}) }) as const;

/**
 * SQL: the signed content is exactly these columns, named and ordered here, so that the same data always
 * hashes the same. Every table these read must draw a new content revision when its rows change
 * (migrations/20261211001000-plate-content-revisions.js); tests/integration/plate-content-hash.test.ts
 * checks that against the tables PostgreSQL's plans of these statements read.
 */
export const CONTENT_SQL = {
  plate: `select p.id, p.label, p.format, p.screen_id as "screenId", p.supersedes_plate_id as "supersedesPlateId", p.imported_by as "importedBy",
            f.filename, f.sha256 as "fileSha256", p.qc_summary as "qcSummary"
       from plates p join uploaded_files f on f.id = p.uploaded_file_id where p.id = :plateId`,
  // Every well of the plate in plate order.
  wells: `select w.id, w.position, w.role, w.compound_id as "compoundId", c.identifier as compound, w.batch_id as "batchId",
            w.concentration_um as "concentrationUm", w.seal_resistance_gohm as "sealResistanceGohm", w.series_resistance_mohm as "seriesResistanceMohm",
            w.capacitance_pf as "capacitancePf", w.excluded, w.exclusion_reason as "exclusionReason", w.excluded_by as "excludedBy"
       from wells w left join compounds c on c.id = w.compound_id where w.plate_id = :plateId order by w.row_index, w.column_index`,
  // Every readout of the plate in plate order.
  readouts: `select r.well_id as "wellId", r.target_id as "targetId", r.control_current_pa as "controlCurrentPa", r.compound_current_pa as "compoundCurrentPa",
            r.fractional_block as "fractionalBlock", r.qc_reasons as "qcReasons", r.readout
       from readouts r join wells w on w.id = r.well_id where w.plate_id = :plateId order by w.row_index, w.column_index, r.target_id, r.readout`,
  fits: `select compound_id as "compoundId", target_id as "targetId", model, status, message, ic50_um as "ic50Um", ic50_ci_low_um as "ic50CiLowUm",
            ic50_ci_high_um as "ic50CiHighUm", ic50_lower_bound_um as "ic50LowerBoundUm", log10_ic50_se as "log10Ic50Se", hill, top, bottom,
            r2, residual_sd as "residualSd", n, flags, estimate, readout
       from fits where plate_id = :plateId order by compound_id, target_id, readout`,
} as const;

export async function selectContentPlate(
  plateId: string,
  transaction?: Transaction,
): Promise<Record<string, unknown> | undefined> {
  const [plate] = await db().query<Record<string, unknown>>(CONTENT_SQL.plate, opts(plateId, transaction));
  return plate;
}

export async function selectContentWells(plateId: string, transaction?: Transaction): Promise<object[]> {
  return db().query(CONTENT_SQL.wells, opts(plateId, transaction));
}

/**
 * A row of signed content names its block readout only when it is not the tonic one, so that the content
 * of every plate with one readout per target (all plates signed before readouts were named) is unchanged.
 */
function withReadoutWhenNamed(rows: Record<string, unknown>[]): object[] {
  return rows.map(({ readout, ...rest }) => (readout === 'tonic' ? rest : { ...rest, readout }));
}

export async function selectContentReadouts(plateId: string, transaction?: Transaction): Promise<object[]> {
  return withReadoutWhenNamed(
    await db().query<Record<string, unknown>>(CONTENT_SQL.readouts, opts(plateId, transaction)),
  );
}

export async function selectContentFits(plateId: string, transaction?: Transaction): Promise<object[]> {
  return withReadoutWhenNamed(
    await db().query<Record<string, unknown>>(CONTENT_SQL.fits, opts(plateId, transaction)),
  );
}

// SQL: the plate's content revision, which triggers draw afresh with every change to its signed content
// (migrations/20261211001000-plate-content-revisions.js); the ORM has no model for it.
export async function selectContentRevision(
  plateId: string,
  transaction?: Transaction,
): Promise<string | null> {
  const [row] = await db().query<{ revision: string }>(
    `select revision::text as revision from plate_content_revisions where plate_id = :plateId`,
    opts(plateId, transaction),
  );
  return row?.revision ?? null;
}

export interface PanelPlateRow {
  id: string;
  label: string;
  state: PlateState;
  version: number;
  importedById: string;
  verifiedById: string | null;
  submittedById: string | null;
  importedBy: string;
  verifiedBy: string | null;
  submittedBy: string | null;
  decidedBy: string | null;
}

// SQL for speed: the plate and the names of its four signers in one query (four joins to users the models do not declare).
export async function selectPanelPlate(plateId: string): Promise<PanelPlateRow | undefined> {
  const [plate] = await db().query<PanelPlateRow>(
    `select p.id, p.label, p.state, p.version, p.imported_by as "importedById", p.verified_by as "verifiedById", p.submitted_by as "submittedById",
            i.name as "importedBy", v.name as "verifiedBy", s.name as "submittedBy", d.name as "decidedBy"
       from plates p join users i on i.id = p.imported_by left join users v on v.id = p.verified_by
       left join users s on s.id = p.submitted_by left join users d on d.id = p.decided_by
      where p.id = :plateId`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return plate;
}

export interface LastSignatureRow {
  signerName: string;
  signedAt: string;
  meaning: string;
  contentSha256: string;
}

// SQL: the time is written as UTC text by PostgreSQL (to_char), with the signer's name, in one query.
export async function selectLastPlateSignature(plateId: string): Promise<LastSignatureRow | undefined> {
  const [last] = await db().query<LastSignatureRow>(
    `select u.name as "signerName", to_char(s.signed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "signedAt", s.meaning, s.content_sha256 as "contentSha256"
       from signatures s join users u on u.id = s.signer_id where s.entity_type = 'plate' and s.entity_id = :plateId order by s.signed_at desc limit 1`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
  return last;
}

export interface HistoryRow {
  id: number;
  occurredAt: string;
  actorName: string | null;
  action: string;
  entityType: string;
  /** Well position, for events of one of the plate's wells. */
  wellPosition: string | null;
  reason: string | null;
  before: Record<string, unknown> | null;
  after: Record<string, unknown> | null;
  meaning: string | null;
  comment: string | null;
  contentSha256: string | null;
  signedAt: string | null;
}

const UUID_TEXT = `'^[0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{4}-[0-9a-fA-F]{12}$'`;

// SQL: audit events joined to wells and signatures through text ids and a JSON field, which the ORM cannot say.
// Each event's well and signature are looked up by primary key (lateral, the text id cast to uuid under a
// CASE on the event's kind and the text's shape, so that nothing else is cast): joined on the text of the ids instead, the
// plan read every signature and all the plate's wells, 25 ms a view on a year of data (docs/performance.md).
export async function selectPlateHistory(plateId: string): Promise<HistoryRow[]> {
  return db().query<HistoryRow>(
    `select a.id, to_char(a.occurred_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "occurredAt", u.name as "actorName", a.action,
            a.entity_type as "entityType", w.position as "wellPosition", a.reason, a.before, a.after,
            s.meaning, s.comment, s.content_sha256 as "contentSha256", to_char(s.signed_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "signedAt"
       from audit_events a
       left join users u on u.id = a.actor_id
       left join lateral (
         select w.position from wells w
          where w.id = case when a.entity_type = 'well' and a.entity_id ~ ${UUID_TEXT} then a.entity_id::uuid end
            and w.plate_id = :plateId
       ) w on true
       left join lateral (
         select s.meaning, s.comment, s.content_sha256, s.signed_at from signatures s
          where s.id = case when a.action = 'sign' and a.after ->> 'signatureId' ~ ${UUID_TEXT} then (a.after ->> 'signatureId')::uuid end
       ) s on true
      where (a.entity_type = 'plate' and a.entity_id = :plateId)
         or (a.entity_type = 'well' and a.entity_id in (select id::text from wells where plate_id = :plateId))
      order by a.id`,
    { type: QueryTypes.SELECT, replacements: { plateId } },
  );
}

// SQL for speed: the latest sign-off's signer and time in one query, in the caller's transaction (two joins the models do not declare).
export async function selectLastSignoff(
  plateId: string,
  transaction: Transaction,
): Promise<{ name: string; signedAt: Date } | undefined> {
  const [last] = await db().query<{ name: string; signedAt: Date }>(
    `select u.name, s.signed_at as "signedAt" from signoff_events e join signatures s on s.id = e.signature_id join users u on u.id = s.signer_id
      where e.plate_id = :plateId order by e.occurred_at desc, s.signed_at desc limit 1`,
    { type: QueryTypes.SELECT, replacements: { plateId }, transaction },
  );
  return last;
}

export interface RecipientRow {
  id: string;
  email: string;
  name: string;
}

// SQL for speed: enabled users holding one of the roles, or with one of the ids, in the caller's transaction, as plain rows.
export async function selectRecipients(
  where: 'role' | 'id',
  values: readonly string[],
  transaction: Transaction,
): Promise<RecipientRow[]> {
  const condition =
    where === 'role'
      ? 'u.id in (select user_id from user_roles where role in (:values))'
      : 'u.id in (:values)';
  return db().query<RecipientRow>(
    `select u.id, u.email, u.name from users u where u.disabled_at is null and ${condition} order by u.email`,
    {
      type: QueryTypes.SELECT,
      replacements: { values },
      transaction,
    },
  );
}

export interface PlateQcRow {
  zPrimeMin: number;
  qcSummary: {
    target: string;
    zPrime?: { zPrime: number | null; message?: string };
    qcRulesNotApplied?: { rule: string; message: string }[];
  }[];
  targets: { id: string; name: string }[];
}

// SQL for speed: the plate's QC summary, its screen's Z′ limit and the names of its targets in one query.
export async function selectPlateQc(
  plateId: string,
  transaction?: Transaction,
): Promise<PlateQcRow | undefined> {
  const [row] = await db().query<PlateQcRow>(
    `select s.z_prime_min as "zPrimeMin", p.qc_summary as "qcSummary",
            coalesce((select json_agg(json_build_object('id', t.id, 'name', t.name) order by t.name) from targets t where t.screen_id = s.id), '[]') as targets
       from plates p join screens s on s.id = p.screen_id where p.id = :plateId`,
    opts(plateId, transaction),
  );
  return row;
}
