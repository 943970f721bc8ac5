import 'server-only';
import { QueryTypes } from 'sequelize';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';

export interface CompoundSummary {
  id: string;
  identifier: string;
  name: string;
  smiles: string;
  molecularWeight: number | null;
  batchCount: number;
  plateCount: number;
}

/** Registered compounds with how many batches and plates they appear in. */
export async function listCompounds(actor: Actor): Promise<CompoundSummary[]> {
  void actor; // every signed-in role may read the registry
  return db().query<CompoundSummary>(
    `select c.id, c.identifier, c.name, c.smiles, c.molecular_weight as "molecularWeight",
            (select count(*)::int from batches b where b.compound_id = c.id) as "batchCount",
            (select count(distinct w.plate_id)::int from wells w where w.compound_id = c.id) as "plateCount"
       from compounds c
      order by upper(c.identifier)`,
    { type: QueryTypes.SELECT },
  );
}
