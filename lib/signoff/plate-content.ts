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
  selectRowVersionFingerprint,
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
 * signature) it is always worked out afresh; otherwise (the history tab) from the row-version cache below.
 */
export async function plateContentSha256(plateId: string, transaction?: Transaction): Promise<string> {
  if (transaction) return contentSha256(await plateContent(plateId, transaction));
  const fingerprint = await rowVersionFingerprint(plateId);
  const cached = contentHashes().get(plateId);
  if (cached && cached.fingerprint === fingerprint && Date.now() - cached.at < CONTENT_HASH_MAX_AGE_MS)
    return cached.sha256;
  // Read the content and the fingerprint in one snapshot, so that the cached hash belongs to that fingerprint.
  const { sha256, fingerprint: seen } = await db().transaction(
    { isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ, readOnly: true },
    async (snapshot) => ({
      sha256: contentSha256(await plateContent(plateId, snapshot)),
      fingerprint: await rowVersionFingerprint(plateId, snapshot),
    }),
  );
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
  return (await selectRowVersionFingerprint(plateId, transaction)) ?? '';
}
