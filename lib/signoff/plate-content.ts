import 'server-only';
import { Transaction } from 'sequelize';
import { contentSha256 } from '@/lib/auth/canonical-json';
import { db } from '@/lib/db';
import { AppError } from '@/lib/errors';
import { processMap } from '@/lib/process-memory';
import {
  selectContentFits,
  selectContentPlate,
  selectContentReadouts,
  selectContentWells,
  selectContentRevision,
} from './queries';

/** Format of the signed plate content; bump it if the fields below ever change. */
export const PLATE_CONTENT_FORMAT = 'gatewell-plate-content/1';

/**
 * The plate's data as a signature covers it: the plate's identity and source file, its QC summary,
 * every well with its exclusion, every readout, and every fit. Workflow fields (state, version, who
 * signed) are left out: they change with each signature, the data only when someone edits it.
 * Rows are ordered so that the same data always gives the same canonical JSON.
 */
export async function plateContent(
  plateId: string,
  transaction?: Transaction,
): Promise<Record<string, unknown>> {
  const plate = await selectContentPlate(plateId, transaction);
  if (!plate) throw new AppError('not_found', 'No such plate.');
  const wells = await selectContentWells(plateId, transaction);
  const readouts = await selectContentReadouts(plateId, transaction);
  const fits = await selectContentFits(plateId, transaction);
  return { format: PLATE_CONTENT_FORMAT, plate, wells, readouts, fits };
}

/**
 * SHA-256 of the canonical JSON of the plate's data as it stands. Inside the caller's transaction (a
 * signature) it is always worked out afresh from the rows; otherwise (the history tab) it comes from a
 * cache of this process, used only while the plate's content revision is the one the hash was worked out
 * at. PostgreSQL triggers draw a new revision in the same transaction as every insert, update or delete
 * of a row the content reads (migrations/20261211001000-plate-content-revisions.js), whoever writes it,
 * and the app's role can neither set a revision nor lift a trigger. So a cached hash never outlives the
 * data it was worked out from; one indexed read of the revision replaces reading the plate's rows.
 */
export async function plateContentSha256(plateId: string, transaction?: Transaction): Promise<string> {
  if (transaction) return contentSha256(await plateContent(plateId, transaction));
  const revision = await selectContentRevision(plateId);
  const cached = contentHashes().get(plateId);
  if (revision && cached?.revision === revision && Date.now() - cached.at < CONTENT_HASH_MAX_AGE_MS)
    return cached.sha256;
  // Views of one plate at one revision arriving together share one reading of its rows: the first
  // starts it, the others wait for its answer (a snapshot begun after they read that revision).
  const key = `${plateId}@${revision ?? 'none'}`;
  const running = hashesInFlight().get(key);
  if (running) return running;
  const work = hashFromRows(plateId).finally(() => hashesInFlight().delete(key));
  hashesInFlight().set(key, work);
  return work;
}

/** The hash worked out from the rows, with the content and its revision read in one snapshot, and remembered. */
async function hashFromRows(plateId: string): Promise<string> {
  const { sha256, revision: seen } = await db().transaction(
    { isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true },
    async (snapshot) => ({
      sha256: contentSha256(await plateContent(plateId, snapshot)),
      revision: await selectContentRevision(plateId, snapshot),
    }),
  );
  if (seen) remember(plateId, { revision: seen, sha256, at: Date.now() });
  return sha256;
}

/** A cached hash is worked out afresh from the rows at least this often, whatever the revision says (common practice, no source). */
export const CONTENT_HASH_MAX_AGE_MS = 10 * 60 * 1000;
const CONTENT_HASH_ENTRIES = 1000;

interface CachedHash {
  revision: string;
  sha256: string;
  at: number;
}

// One cache per server process, shared by the bundles that import this module.
const contentHashes = () => processMap<string, CachedHash>('plateContentHashes');
// The readings of plates' rows under way in this process, by plate and the revision read before starting.
const hashesInFlight = () => processMap<string, Promise<string>>('plateContentHashesInFlight');

function remember(plateId: string, entry: CachedHash): void {
  const cache = contentHashes();
  cache.delete(plateId);
  cache.set(plateId, entry);
  if (cache.size > CONTENT_HASH_ENTRIES) cache.delete(cache.keys().next().value!);
}
