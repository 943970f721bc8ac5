import 'server-only';
import { ConnectionError, DatabaseError } from 'sequelize';

/** What people read when the database cannot be reached: the request changed nothing and may be repeated. */
export const DATABASE_UNAVAILABLE_MESSAGE =
  'Gatewell cannot reach its database just now, so nothing was changed. Try again in a minute.';

/** pg's words for a connection that broke under a query; they come without an SQLSTATE. */
const BROKEN_CONNECTION = /^(Connection terminated|Client has encountered a connection error)/;

/**
 * Whether an error means the database was out of reach or went away mid-request (restart, shutdown,
 * network) rather than refusing a statement: no connection could be made (Sequelize's ConnectionError),
 * the server ended the session (SQLSTATE class 08 connection exception or 57P operator intervention),
 * or pg lost the connection under the query.
 */
export function isDatabaseUnavailable(error: unknown): boolean {
  if (error instanceof ConnectionError) return true;
  if (!(error instanceof DatabaseError)) return false;
  const code = (error.parent as { code?: unknown }).code;
  if (typeof code === 'string' && (code.startsWith('08') || code.startsWith('57P'))) return true;
  return BROKEN_CONNECTION.test(error.parent.message);
}

/**
 * What people read when the database's disk is full. Uploaded files are kept in the database
 * (uploaded_files, import_drafts, import_uploads), so this is where the upload storage fills up; the
 * statement that met the full disk was rolled back with its whole transaction.
 */
export const STORAGE_FULL_MESSAGE =
  "The server's upload storage is full, so nothing was stored or changed. Tell your Gatewell administrator; it works again once space has been freed.";

/** Whether PostgreSQL refused a write because its disk is full (SQLSTATE 53100 disk_full, "No space left on device"). */
export function isStorageFull(error: unknown): boolean {
  return error instanceof DatabaseError && (error.parent as { code?: unknown }).code === '53100';
}

/**
 * Runs `work`, and again while it fails because the database is out of reach (a restart, a failover),
 * half a second apart, until it succeeds or `withinMs` has passed (then the last error is thrown). Any
 * other error is thrown at once. For a worker's own bookkeeping, which nobody can repeat for it.
 */
export async function untilDatabaseAnswers<T>(work: () => Promise<T>, withinMs: number): Promise<T> {
  const deadline = Date.now() + withinMs;
  for (;;) {
    try {
      return await work();
    } catch (error) {
      if (!isDatabaseUnavailable(error) || Date.now() >= deadline) throw error;
      await new Promise((resolve) => setTimeout(resolve, 500));
    }
  }
}
