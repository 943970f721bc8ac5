import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '@/lib/db';
import type { BlockReadout } from '@/lib/domain/fits';
import type { FitModel, FitStatus } from '@/lib/domain/fits';
import type { PlateState } from '@/lib/domain/plate-states';

/** One fit of a compound on one plate, with where it stands in sign-off. */
export interface ProfileFit {
  fitId: string;
  plateId: string;
  plateLabel: string;
  plateState: PlateState;
  /** Only approved plates count as results (DESIGN.md, Results); the rest are shown as not yet approved. */
  approved: boolean;
  importedAt: string;
  screenId: string;
  screenName: string;
  targetId: string;
  target: string;
  conductance: string;
  /** The readout fitted, and the name the screen gives it (null: the target reports one readout). */
  readout: BlockReadout;
  readoutName: string | null;
  model: FitModel;
  status: FitStatus;
  message: string;
  ic50_uM: number | null;
  ic50CiLow_uM: number | null;
  ic50CiHigh_uM: number | null;
  ic50LowerBound_uM: number | null;
  hill: number | null;
  r2: number | null;
  n: number;
}

// SQL for speed: every fit of the compound with its plate, screen and target in one query, approved plates first.
export async function selectCompoundFits(compoundId: string): Promise<ProfileFit[]> {
  return db().query<ProfileFit>(
    `select f.id as "fitId", p.id as "plateId", p.label as "plateLabel", p.state as "plateState", (p.state = 'approved') as approved,
            to_char(p.imported_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "importedAt",
            s.id as "screenId", s.name as "screenName", t.id as "targetId", t.name as target, t.conductance,
            f.readout, t.block_readouts ->> f.readout as "readoutName",
            f.model, f.status, f.message, f.ic50_um as "ic50_uM", f.ic50_ci_low_um as "ic50CiLow_uM", f.ic50_ci_high_um as "ic50CiHigh_uM",
            f.ic50_lower_bound_um as "ic50LowerBound_uM", f.hill, f.r2, f.n
       from fits f join plates p on p.id = f.plate_id join screens s on s.id = p.screen_id join targets t on t.id = f.target_id
      where f.compound_id = :compoundId
      order by (p.state = 'approved') desc, p.imported_at desc, p.label, t.name, f.readout`,
    { type: QueryTypes.SELECT, replacements: { compoundId } },
  );
}

export interface CompoundSummary {
  id: string;
  identifier: string;
  name: string;
  smiles: string;
  molecularWeight: number | null;
  batchCount: number;
  plateCount: number;
}

// SQL: counts of batches and distinct plates per compound (aggregates the ORM cannot say), ordered case-blind.
export async function selectCompoundSummaries(): Promise<CompoundSummary[]> {
  return db().query<CompoundSummary>(
    `select c.id, c.identifier, c.name, c.smiles, c.molecular_weight as "molecularWeight",
            (select count(*)::int from batches b where b.compound_id = c.id) as "batchCount",
            (select count(distinct w.plate_id)::int from wells w where w.compound_id = c.id) as "plateCount"
       from compounds c
      order by upper(c.identifier)`,
    { type: QueryTypes.SELECT },
  );
}

// SQL: compounds matched case-blind on upper(identifier), which the ORM's where cannot say plainly.
export async function selectRegisteredIdentifiers(upperIds: string[]): Promise<{ identifier: string }[]> {
  return db().query<{ identifier: string }>(
    'select identifier from compounds where upper(identifier) in (:ids)',
    {
      type: QueryTypes.SELECT,
      replacements: { ids: upperIds },
    },
  );
}

/** A registered compound found by identifier or alias, with the name the file used (upper-cased). */
export interface NamedCompound {
  name: string;
  id: string;
  identifier: string;
}

// SQL: identifiers and aliases matched case-blind in one query (a union the ORM cannot say); identifiers win.
export async function selectCompoundsByUpperName(
  upperNames: string[],
  transaction?: Transaction,
): Promise<NamedCompound[]> {
  if (!upperNames.length) return [];
  return db().query<NamedCompound>(
    `select distinct on (name) name, id, identifier from (
        select upper(c.identifier) as name, c.id, c.identifier, 0 as rank from compounds c where upper(c.identifier) in (:names)
        union all
        select upper(a.alias), c.id, c.identifier, 1 from compound_aliases a join compounds c on c.id = a.compound_id
         where upper(a.alias) in (:names)
      ) found order by name, rank`,
    { type: QueryTypes.SELECT, replacements: { names: upperNames }, ...(transaction ? { transaction } : {}) },
  );
}

// SQL: every name an import may use for a compound, identifiers and aliases, in one read.
export async function selectAllCompoundNames(transaction?: Transaction): Promise<string[]> {
  const rows = await db().query<{ name: string }>(
    'select identifier as name from compounds union all select alias from compound_aliases',
    { type: QueryTypes.SELECT, ...(transaction ? { transaction } : {}) },
  );
  return rows.map((r) => r.name);
}

// SQL: a transaction-scoped advisory lock, so that identifiers and aliases are added one writer at a time
// (their uniqueness spans two tables, which no index can keep).
export async function lockCompoundNames(transaction: Transaction): Promise<void> {
  await db().query("select pg_advisory_xact_lock(hashtext('gatewell.compound-names'))", { transaction });
}

// SQL: the labels of the approved plates whose wells use the compound (their signed content names its identifier).
export async function selectApprovedPlateLabels(
  compoundId: string,
  transaction?: Transaction,
): Promise<string[]> {
  const rows = await db().query<{ label: string }>(
    `select distinct p.label from plates p join wells w on w.plate_id = p.id
      where w.compound_id = :compoundId and p.state = 'approved' order by p.label`,
    { type: QueryTypes.SELECT, replacements: { compoundId }, ...(transaction ? { transaction } : {}) },
  );
  return rows.map((r) => r.label);
}
